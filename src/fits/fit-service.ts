import { RemapError } from '../engine/errors';
import type { FitContext, Progress, TransportMap } from '../engine/map';
import { startFit } from '../engine/methods';
import type { Sample } from '../engine/points';
import type { MaybePromise } from './maybe-promise';
import type { FitInputs } from './read-fit';
import { recall, recallOrFit, running } from './store';
import { noteCellMap } from './cell-maps';
import { budgetError } from './time-budget';
import { tellWatchers } from './watchers';

/** What a caller may hand a fit: progress, cancellation, and the FIT cell's address (kept beside the map). */
export interface FitRun extends Omit<FitContext, 'dropped' | 'columns'> {
  readonly cell?: string;
}

/**
 * Where fits run. The default runs them in this thread through the engine; the
 * add-in sets one that sends fits to a Web Worker, so a worksheet page never
 * blocks while a map is fitted. A fitter must honour `ctx.signal` (reading
 * `aborted` now and then) and report progress through `ctx.onProgress`.
 */
export type Fitter = (method: string, source: Sample, target: Sample, settings: Record<string, unknown>, ctx: FitContext) => MaybePromise<TransportMap>;

/** Fits in this thread, through the engine (the default Fitter). */
export const fitInThisThread: Fitter = (method, source, target, settings, ctx) => startFit(method, source, target, settings, ctx);
let fitter: Fitter = fitInThisThread;

/** Where fits run now (fitInThisThread unless the host set another). */
export function currentFitter(): Fitter {
  return fitter;
}

/** Sets where fits run (null: back to this thread). */
export function setFitter(f: Fitter | null): void {
  fitter = f ?? fitInThisThread;
}

/**
 * Fits (or finds) the map the inputs describe. The fit is stopped through its
 * signal when the caller's signal aborts or, for methods without their own
 * time_budget, when the budget runs out; that case throws a RemapError saying
 * what to do. Every progress report also goes to the session's fit watchers.
 * A caller that joined a fit another caller started (same handle) and saw it
 * cancelled there starts it again itself, once, so cancelling one cell never
 * leaves another cell with an error it did not ask for.
 * Cost: that of the fit, or O(1) when the handle is known.
 */
export function fitFromInputs(inputs: FitInputs, ctx: FitRun = {}, retries = 1): MaybePromise<TransportMap> {
  const outer = ctx.signal;
  if (ctx.cell) noteCellMap(ctx.cell, inputs.fn, inputs.handle);
  const joined = recall(inputs.handle) === undefined && running(inputs.handle) !== undefined;
  const deadline = Number.isFinite(inputs.budgetSeconds) ? Date.now() + inputs.budgetSeconds * 1000 : Infinity;
  let overBudget = false;
  // A getter: the engine reads `aborted` as it iterates, so a synchronous fit is stopped too.
  const signal = {
    get aborted(): boolean {
      if (outer?.aborted) return true;
      if (!overBudget && Date.now() > deadline) overBudget = true;
      return overBudget;
    },
  };
  const onProgress = (p: Progress): void => {
    ctx.onProgress?.(p);
    tellWatchers(inputs.handle, p);
  };
  const overrun = (e: unknown): never => {
    if (overBudget && !outer?.aborted && e instanceof RemapError && e.kind === 'cancelled') {
      throw budgetError(inputs.fn, inputs.method, inputs.source.sample.n, inputs.target.sample.n, inputs.budgetSeconds);
    }
    throw e;
  };
  let r: MaybePromise<TransportMap>;
  try {
    r = recallOrFit(
      inputs.handle,
      () =>
        fitter(inputs.method, inputs.source.sample, inputs.target.sample, inputs.settings, {
          onProgress,
          signal,
          dropped: { source: inputs.source.dropped, target: inputs.target.dropped },
          columns: inputs.source.columns ?? inputs.target.columns,
        }),
      ctx.cell ? { cell: ctx.cell } : undefined,
    );
  } catch (e) {
    return overrun(e);
  }
  if (!(r instanceof Promise)) return r;
  return r.catch((e: unknown) => {
    const cancelledElsewhere = joined && retries > 0 && !outer?.aborted && !overBudget && e instanceof RemapError && e.kind === 'cancelled';
    return cancelledElsewhere ? fitFromInputs(inputs, ctx, retries - 1) : overrun(e);
  });
}
