import { RemapError } from '../../engine/errors';
import type { Diagnostics, Progress } from '../../engine/map';
import type { Sample } from '../../engine/points';

/* Messages between the page and the fit worker (fit-worker.ts). */

/** What the pane asks the fit worker: the cells of one fit, exactly as REMAP.FIT would receive them. */
export interface FitRequest {
  readonly type: 'fit';
  readonly id: number;
  readonly source: unknown[][];
  readonly target: unknown[][];
  readonly method: string;
  readonly settings: string;
  readonly sourceWeights: unknown[][] | null;
  readonly targetWeights: unknown[][] | null;
}

/** Rows kept for the plots: at most PLOT_MAX_ROWS per sample, every k-th row (never at random). */
export const PLOT_MAX_ROWS = 20_000;

/** One sample as the plots receive it: rows x d values, row-major, with optional weights. */
export interface PlotSample {
  readonly n: number;
  readonly d: number;
  readonly data: Float64Array;
  readonly weights: Float64Array | null;
}

/** A finished fit, as the worker returns it. */
export interface FitDone {
  readonly type: 'done';
  readonly id: number;
  readonly handle: string;
  readonly method: string;
  /** Why auto chose the method, or null. */
  readonly reason: string | null;
  /** The map's JSON (what the workbook keeps). */
  readonly json: string;
  readonly diagnostics: Diagnostics;
  readonly columns: readonly string[] | null;
  /** Thinned source, mapped source (same rows) and target, for the plots. */
  readonly source: PlotSample;
  readonly mapped: PlotSample;
  readonly target: PlotSample;
  readonly elapsedMs: number;
}

/**
 * What a worksheet cell's fit asks the worker: samples already read on the page
 * (the page derived the handle from them), the method and the engine's settings.
 */
export interface SampleFitRequest {
  readonly type: 'fit-samples';
  readonly id: number;
  readonly method: string;
  readonly source: Sample;
  readonly target: Sample;
  readonly settings: Record<string, unknown>;
  readonly dropped: { readonly source: number; readonly target: number };
  readonly columns: readonly string[] | null;
}

/** A cell's fit, finished in the worker: the map's JSON (its diagnostics already computed there). */
export interface SampleFitDone {
  readonly type: 'map';
  readonly id: number;
  readonly json: string;
}

/** Rows for a fitted map to map off the page: the map's JSON (the worker keeps the last one it read) and the rows. */
export interface MapPointsRequest {
  readonly type: 'map-points';
  readonly id: number;
  readonly json: string;
  readonly verb: 'apply' | 'invert';
  readonly points: { readonly n: number; readonly d: number; readonly data: Float64Array };
}

/** The mapped rows, and how many lay outside the fitted range. */
export interface MappedPoints {
  readonly type: 'mapped';
  readonly id: number;
  readonly data: Float64Array;
  readonly outside: number;
}

export type WorkerRequest = FitRequest | SampleFitRequest | MapPointsRequest;

export type FitReply =
  | { readonly type: 'progress'; readonly id: number; readonly progress: Progress }
  | FitDone
  | SampleFitDone
  | MappedPoints
  | { readonly type: 'error'; readonly id: number; readonly message: string; readonly kind: string };

/**
 * The RemapError a worker's error reply stands for: its message, and its kind where the kind is one a worksheet error
 * tells apart (num, na, cancelled), else value. O(1).
 * @example replyError({ type: 'error', id: 1, message: 'x', kind: 'num' }).kind // 'num'
 */
export function replyError(m: { readonly message: string; readonly kind: string }): RemapError {
  return new RemapError(m.message, m.kind === 'num' || m.kind === 'na' || m.kind === 'cancelled' ? m.kind : 'value');
}
