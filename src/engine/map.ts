import type { Points } from './points';
import type { Settings } from './settings';

/**
 * The one interface every fitted map honours, whatever the method. A map is
 * fitted once (by its method's `fit`) and is read-only afterwards: applying it
 * changes nothing in it, so its report never depends on which cells were
 * calculated first. Each call's own rows outside the fitted range are counted
 * in its `Mapped.outside`, and `extrapolationWarning` (outside.ts) words them.
 */

/** Method names, as typed in formulas and on the command line. */
export type MethodName = 'quantile' | 'step' | 'ordinal' | 'linear' | 'pairs' | 'entropic' | 'gradient-net';

/** Values mapped by `apply` or `invert`, with how many rows lay outside the fitted range. */
export interface Mapped extends Points {
  /** Rows with at least one coordinate outside the range the map was fitted on (source range for apply, target range for invert). */
  readonly outside: number;
}

/**
 * How a cost figure relates to the squared 2-Wasserstein distance between the
 * source and target samples: 'exact' (it is that distance), 'lower' (a proven
 * lower bound on it), 'estimate' (neither: an approximation, or another quantity).
 */
export type CostBound = 'exact' | 'lower' | 'estimate';

/** What a map's transport cost is and how it was computed. */
export interface CostReport {
  /**
   * exact-1d: squared W2 between the two empirical distributions (exact, from quantile functions);
   * per-column-1d: the sum over columns of exact 1-D squared W2 (the marginals only);
   * bures: the Gaussian closed form from means and covariances;
   * assignment: the optimal assignment's mean squared distance (exact for equal-size samples);
   * sinkhorn-divergence: the debiased entropic cost;
   * mapped: the mean squared displacement |T(x) - x|^2 over the weighted source rows.
   */
  readonly kind: 'exact-1d' | 'per-column-1d' | 'bures' | 'assignment' | 'sinkhorn-divergence' | 'mapped';
  readonly w2Squared: number;
  readonly w2: number;
  /** Exact W1 where the method knows it (1-D). */
  readonly w1?: number;
  /** Per-column squared W2 for per-column maps. */
  readonly perColumn?: readonly number[];
  /** One sentence saying what the figure is. */
  readonly note: string;
  /** How the figure relates to the samples' squared W2; filled from `kind` by `labelCost` when a method leaves it out. */
  readonly bound?: CostBound;
  /** A short name every door prints beside the number, e.g. "squared W2, lower bound (sum over columns)". */
  readonly label?: string;
  /** The units the figure is in: the data's own ('raw') or each column divided by its pooled spread ('standardised'). */
  readonly units?: 'raw' | 'standardised';
}

/** A cost with its bound and label always present, as maps report it. */
export interface LabelledCost extends CostReport {
  readonly bound: CostBound;
  readonly label: string;
}

/** Rows per side: how many there were, or how many a figure used. */
export interface RowCounts {
  readonly source: number;
  readonly target: number;
}

/**
 * Which rows the comparison figures (energy distance before and after, KS
 * after) were measured on. Figures of two maps compare only when both were
 * measured on the same rows: use `compareOn` to measure several maps on one set.
 */
export interface ComparisonRows {
  /** 'fitting rows': each map's own fitting samples; 'rows given': the rows a caller passed to compareOn. */
  readonly basis: 'fitting rows' | 'rows given';
  /** Rows per side the KS statistic used (all of them). */
  readonly ks: RowCounts;
  /** Rows per side the energy distances used: a seeded subsample when a side is larger than the cap and d > 1. */
  readonly energy: RowCounts;
  /** The subsample's seed, or null when every row was used. */
  readonly seed: number | null;
  /** The same in words, for reports. */
  readonly note: string;
}

export type WarningCode =
  | 'small-sample'
  | 'rows-dropped'
  | 'extrapolation'
  | 'not-converged'
  | 'singular-covariance'
  | 'ridge-added'
  | 'marginals-only'
  | 'ties'
  | 'source-rows-only'
  | 'time-budget'
  | 'unequal-sizes'
  | 'different-rows'
  | 'compacted'
  | 'kept-linear-start';

/** A plain-language caution with what to do about it. */
export interface Warning {
  readonly code: WarningCode;
  readonly message: string;
  readonly action: string;
}

export interface Convergence {
  readonly iterations: number;
  /** The stopping criterion's last value (marginal error, loss, ...). */
  readonly finalError: number;
  readonly converged: boolean;
  /** What `finalError` measures, in words. */
  readonly criterion: string;
}

/** Everything a user may want to know before trusting a map. */
export interface Diagnostics {
  readonly method: MethodName;
  readonly settings: Settings;
  readonly n: { readonly source: number; readonly target: number };
  readonly d: number;
  readonly columns: readonly string[] | null;
  readonly dropped: { readonly source: number; readonly target: number };
  /** Kish's effective sample size per side, (sum w)^2 / sum w^2 (Kish 1965, Survey Sampling); equals the rows when unweighted. Absent when unknown. */
  readonly effectiveSize?: RowCounts;
  readonly cost: LabelledCost;
  /** Energy distance (Szekely & Rizzo) between source and target, and between mapped source and target. */
  readonly energyBefore?: number;
  readonly energyAfter?: number;
  /** Largest per-column Kolmogorov-Smirnov statistic between mapped source and target. */
  readonly ksMaxAfter?: number;
  /** Smallest eigenvalue of the symmetrised Jacobian over the source rows (>= 0 certifies monotone). */
  readonly minJacobianEigenvalue?: number;
  readonly convergence?: Convergence;
  /** Which rows energyBefore, energyAfter and ksMaxAfter were measured on. */
  readonly comparison?: ComparisonRows;
  /** What happens to values outside the fitted range for this method and settings, in words. */
  readonly outside: string;
  readonly warnings: readonly Warning[];
  /** One line shown even when there are no warnings. */
  readonly reminder: string;
}

/** The serialised form: what REMAP.SAVE returns, the CLI writes, and the workbook stores. */
export interface MapJSON {
  readonly format: 'remap.map';
  readonly version: 1;
  readonly method: MethodName;
  readonly d: number;
  readonly settings: Settings;
  readonly columns: readonly string[] | null;
  readonly n: { readonly source: number; readonly target: number };
  readonly dropped: { readonly source: number; readonly target: number };
  /** The method's fitted parameters; only its own fromJSON reads them. */
  readonly params: unknown;
  /** Fit-time diagnostics (warnings, convergence, cost) so a loaded map reports what the fitted one did. */
  readonly fitted: FitRecord;
}

/** The parts of diagnostics fixed at fit time. */
export interface FitRecord {
  readonly cost: CostReport;
  readonly energyBefore?: number;
  readonly energyAfter?: number;
  readonly ksMaxAfter?: number;
  readonly minJacobianEigenvalue?: number;
  readonly convergence?: Convergence;
  readonly comparison?: ComparisonRows;
  readonly effectiveSize?: RowCounts;
  readonly warnings: readonly Warning[];
}

export interface TransportMap {
  readonly method: MethodName;
  /** Number of columns the map takes and returns. */
  readonly d: number;
  /** The resolved settings the map was fitted with. */
  readonly settings: Settings;
  /** T(x) for each row of `x` (x.d must equal d). Never mutates x. */
  apply(x: Points): Mapped;
  /** T^-1(y) for each row of `y`. Throws RemapError where the method has no inverse for new points. */
  invert(y: Points): Mapped;
  cost(): LabelledCost;
  /** Fit-time facts only: the same whatever was applied before. */
  diagnostics(): Diagnostics;
  toJSON(): MapJSON;
  /** Frees resources held outside the JS heap (tensors); a no-op for plain maps. */
  dispose(): void;
  /**
   * Roughly how many multiply-adds mapping one row costs in this direction (an order of magnitude, for a caller
   * deciding whether to map on its own thread or in a worker). O(1).
   */
  workPerRow(verb: 'apply' | 'invert'): number;
}

/** Progress of a running fit, for the pane and streaming cells. */
export interface Progress {
  readonly step: number;
  readonly of: number;
  readonly loss: number;
  readonly elapsedMs: number;
  readonly message?: string;
}

/** What a caller hands a fit besides the data and settings. */
export interface FitContext {
  /** Rows dropped by coercion, reported in diagnostics. */
  readonly dropped?: { readonly source: number; readonly target: number };
  /** Column names, if the data had a header. */
  readonly columns?: readonly string[] | null;
  /** Called now and then by iterative fits. */
  readonly onProgress?: (p: Progress) => void;
  /** Checked by iterative fits; when `aborted` becomes true the fit throws RemapError(kind 'cancelled'). */
  readonly signal?: { readonly aborted: boolean };
}
