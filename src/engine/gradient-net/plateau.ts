/**
 * Early stopping on a smoothed loss plateau (common practice): the loss is
 * smoothed by an exponential moving average with bias correction (as in Adam,
 * Kingma & Ba, arXiv 1412.6980, sec. 3); every `window` steps the smoothed value
 * is compared with the best so far, and if it has not improved by
 * `relTol` * |best| + absTol for `patience` steps, a plateau is declared.
 */
export class PlateauDetector {
  private ema = 0;
  private count = 0;
  private best = Infinity;
  private sinceBest = 0;
  private readonly beta: number;
  private readonly window: number;
  private readonly patience: number;
  private readonly relTol: number;
  private readonly absTol: number;

  /**
   * @param opts.beta smoothing in (0, 1) (default 0.95, about 20 steps of memory);
   * window >= 1 steps between checks (default 25); patience >= window (default 100);
   * relTol >= 0 (default 0.01); absTol >= 0 (default 0).
   */
  constructor(opts: { beta?: number; window?: number; patience?: number; relTol?: number; absTol?: number } = {}) {
    this.beta = opts.beta ?? 0.95;
    this.window = opts.window ?? 25;
    this.patience = opts.patience ?? 100;
    this.relTol = opts.relTol ?? 0.01;
    this.absTol = opts.absTol ?? 0;
  }

  /** The bias-corrected smoothed loss so far (NaN before the first value). */
  get smoothed(): number {
    return this.count === 0 ? NaN : this.ema / (1 - Math.pow(this.beta, this.count));
  }

  /** Forgets the best value (after a learning-rate change). */
  reset(): void {
    this.best = Infinity;
    this.sinceBest = 0;
  }

  /**
   * Adds one loss value; returns true when a plateau is reached. O(1).
   * @example for (const l of losses) if (det.push(l)) break;
   */
  push(loss: number): boolean {
    this.count++;
    this.ema = this.beta * this.ema + (1 - this.beta) * loss;
    if (this.count % this.window !== 0) return false;
    const s = this.smoothed;
    if (s < this.best - (this.relTol * Math.abs(this.best === Infinity ? s : this.best) + this.absTol)) {
      this.best = s;
      this.sinceBest = 0;
      return false;
    }
    this.sinceBest += this.window;
    return this.sinceBest >= this.patience;
  }
}
