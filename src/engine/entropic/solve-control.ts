import { RemapError } from '../errors';
import type { FitContext } from '../map';

/**
 * Cancellation and progress for the Sinkhorn loops: one object shared by the
 * solves of a fit, so the iteration count and the clock run across all of them.
 * Progress is reported at most every `intervalMs` (and on the first call), so a
 * fast loop does not flood the pane.
 */
export class SolveControl {
  private readonly ctx: Pick<FitContext, 'onProgress' | 'signal'>;
  private readonly started: number;
  private readonly of: number;
  private readonly intervalMs: number;
  private lastReport = -Infinity;
  /** Iterations done so far, over every solve that shares this control. */
  step = 0;

  /**
   * @param ctx the fit context (its onProgress and signal are optional).
   * @param of the planned total number of iterations, shown as "step of of".
   * @param intervalMs the least time between two progress calls (>= 0).
   * @example new SolveControl({}, 3000) // counts iterations, reports nothing
   */
  constructor(ctx: Pick<FitContext, 'onProgress' | 'signal'>, of: number, intervalMs = 200) {
    this.ctx = ctx;
    this.of = of;
    this.intervalMs = intervalMs;
    this.started = Date.now();
  }

  /**
   * Counts one iteration whose stopping criterion is `loss`; throws if the fit
   * was cancelled and reports progress when due. O(1).
   * @throws RemapError (kind 'cancelled') once `ctx.signal.aborted` is true.
   */
  tick(loss: number, message?: string): void {
    this.step++;
    if (this.ctx.signal?.aborted) {
      throw new RemapError(`fit (entropic): cancelled after ${this.step} Sinkhorn iterations; start the fit again to get a map.`, 'cancelled');
    }
    if (this.ctx.onProgress) {
      const now = Date.now();
      if (now - this.lastReport >= this.intervalMs) {
        this.lastReport = now;
        this.ctx.onProgress({ step: this.step, of: this.of, loss, elapsedMs: now - this.started, message });
      }
    }
  }

  /** Milliseconds since this control was made. */
  elapsedMs(): number {
    return Date.now() - this.started;
  }
}
