import { COMPARISON_MAX_ROWS, COMPARISON_SEED, compareFit, comparisonRows, type Comparisons } from './assess';
import { labelCost } from './cost-label';
import { RemapError } from './errors';
import type { ComparisonRows, Diagnostics, FitContext, FitRecord, LabelledCost, MapJSON, Mapped, MethodName, RowCounts, TransportMap, Warning } from './map';
import { outsideText } from './outside';
import { kishEffectiveSize } from './stats/effective-size';
import type { Points, Sample } from './points';
import type { Settings } from './settings';

/** What every fitted map records about how it was fitted. */
export interface MapHeader {
  readonly method: MethodName;
  readonly d: number;
  readonly settings: Settings;
  readonly columns: readonly string[] | null;
  readonly n: { readonly source: number; readonly target: number };
  readonly dropped: { readonly source: number; readonly target: number };
}

/**
 * The header of a map fitted from `source` and `target`: what every method records the same way.
 * O(1).
 * @example fitHeader('linear', src, tgt, settings, {}).n // { source: src.n, target: tgt.n }
 */
export function fitHeader(method: MethodName, source: Points, target: Points, settings: Settings, ctx: FitContext): MapHeader {
  return {
    method,
    d: source.d,
    settings,
    columns: ctx.columns ?? null,
    n: { source: source.n, target: target.n },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
}

/** The header of a map restored from JSON whose envelope `parseMapJSON` has checked. O(1). */
export function jsonHeader(json: MapJSON): MapHeader {
  return { method: json.method, d: json.d, settings: json.settings, columns: json.columns, n: json.n, dropped: json.dropped };
}

/** The line every report shows, warnings or not. */
export const ESTIMATE_REMINDER = 'A statistical estimate from two samples: validate it on held-out data before it drives a decision.';

/**
 * Shared bookkeeping for fitted maps: shape checks, diagnostics and JSON. A
 * method implements `applyPoints`, `invertPoints` and `params`; everything a
 * user sees about a map is assembled here so that all methods report alike.
 * Applying a map changes nothing in it: each call's rows outside the fitted
 * range are counted in its own result (`Mapped.outside`), never in the map, so
 * a report does not depend on which cells were calculated first.
 */
export abstract class BaseMap implements TransportMap {
  readonly method: MethodName;
  readonly d: number;
  readonly header: MapHeader;
  readonly fitted: FitRecord;
  private pending: { source: Sample; target: Sample } | null = null;
  private compared: Comparisons | null = null;
  private effective: RowCounts | null = null;

  protected constructor(header: MapHeader, fitted: FitRecord) {
    this.header = header;
    this.method = header.method;
    this.d = header.d;
    this.fitted = fitted;
  }

  get settings(): Settings {
    return this.header.settings;
  }

  protected abstract applyPoints(x: Points): Mapped;
  protected abstract invertPoints(y: Points): Mapped;
  /** The method's fitted parameters as plain JSON (numbers finite, arrays plain). */
  protected abstract params(): unknown;

  /** A closed form or a look-up: about d^2 (linear) or a few dozen (a binary search) multiply-adds a row; heavier methods override it. */
  workPerRow(verb: 'apply' | 'invert'): number {
    void verb;
    return Math.max(32, this.d * this.d);
  }

  apply(x: Points): Mapped {
    this.checkShape(x, 'apply');
    return this.applyPoints(x);
  }

  invert(y: Points): Mapped {
    this.checkShape(y, 'invert');
    return this.invertPoints(y);
  }

  cost(): LabelledCost {
    return labelCost(this.fitted.cost);
  }

  /**
   * Keeps the fitted samples so that the energy distances and KS statistic
   * (assess.ts) can be computed when diagnostics or JSON are first asked for,
   * rather than slowing every fit (a no-op for them when the method recorded
   * them itself), and records Kish's effective sizes from the weights when the
   * method did not. The samples are held by reference: the engine never mutates them.
   */
  attachSamples(source: Sample, target: Sample): void {
    if (this.fitted.effectiveSize === undefined) {
      this.effective = { source: kishEffectiveSize(source.weights, source.n), target: kishEffectiveSize(target.weights, target.n) };
    }
    if (this.fitted.energyAfter === undefined && this.fitted.ksMaxAfter === undefined) this.pending = { source, target };
  }

  /** The fit record with any comparisons and effective sizes computed since fitting. */
  private record(): FitRecord {
    if (this.pending) {
      const { source, target } = this.pending;
      this.pending = null;
      try {
        this.compared = compareFit(source, source.weights, this.applyPoints(source), target, target.weights);
      } catch {
        this.compared = null; // a comparison that cannot be made is left out, never guessed
      }
    }
    let out: FitRecord = this.compared ? { ...this.fitted, ...this.compared } : this.fitted;
    if (out.energyAfter !== undefined && out.comparison === undefined) {
      // Recorded by a method that measured on its own fitting rows without saying so.
      out = { ...out, comparison: fittingRowsComparison(this.header) };
    }
    if (this.effective && out.effectiveSize === undefined) {
      out = { ...out, effectiveSize: this.effective, warnings: withEffectiveSizeWarning(out.warnings, this.header, this.effective) };
    }
    return out;
  }

  /** Fit-time facts only; the same whatever was applied before. */
  diagnostics(): Diagnostics {
    const fitted = this.record();
    return {
      method: this.method,
      settings: this.header.settings,
      n: this.header.n,
      d: this.d,
      columns: this.header.columns,
      dropped: this.header.dropped,
      ...(fitted.effectiveSize ? { effectiveSize: fitted.effectiveSize } : {}),
      cost: labelCost(fitted.cost),
      energyBefore: fitted.energyBefore,
      energyAfter: fitted.energyAfter,
      ksMaxAfter: fitted.ksMaxAfter,
      minJacobianEigenvalue: fitted.minJacobianEigenvalue,
      convergence: fitted.convergence,
      ...(fitted.comparison ? { comparison: fitted.comparison } : {}),
      outside: outsideText(this.method, this.header.settings),
      warnings: [...fitted.warnings],
      reminder: ESTIMATE_REMINDER,
    };
  }

  toJSON(): MapJSON {
    return {
      format: 'remap.map',
      version: 1,
      method: this.method,
      d: this.d,
      settings: this.header.settings,
      columns: this.header.columns,
      n: this.header.n,
      dropped: this.header.dropped,
      params: this.params(),
      fitted: this.record(),
    };
  }

  dispose(): void {
    /* plain maps hold nothing outside the JS heap */
  }

  private checkShape(x: Points, verb: string): void {
    if (x.d !== this.d) {
      throw new RemapError(
        `${verb}: the values have ${x.d} column${x.d === 1 ? '' : 's'} but the ${this.method} map was fitted on ${this.d}; give values with ${this.d} column${this.d === 1 ? '' : 's'}.`,
      );
    }
  }
}

/** The comparison rows of a method that measured on all its fitting rows (assess.ts's subsample rule). */
function fittingRowsComparison(header: MapHeader): ComparisonRows {
  const { n, d } = header;
  const cut = (rows: number) => (d > 1 ? Math.min(rows, COMPARISON_MAX_ROWS) : rows);
  const sub = d > 1 && (n.source > COMPARISON_MAX_ROWS || n.target > COMPARISON_MAX_ROWS);
  return comparisonRows('fitting rows', n, { source: cut(n.source), target: cut(n.target) }, sub ? COMPARISON_SEED : null);
}

/** The fewest rows (or effective rows) per side below which a map is flagged as rough (common practice). */
export function smallSampleThreshold(d: number): number {
  return d === 1 ? 30 : Math.max(30, 10 * d);
}

/**
 * Replaces a row-count 'small-sample' warning by one on Kish's effective
 * size, which is what limits an estimate from weighted rows. O(#warnings).
 */
function withEffectiveSizeWarning(warnings: readonly Warning[], header: MapHeader, effective: RowCounts): Warning[] {
  const out = warnings.filter((w) => w.code !== 'small-sample');
  const w = smallSampleWarning(header, effective);
  if (w) out.unshift(w);
  return out;
}

/**
 * The small-sample warning on Kish's effective size (Kish 1965, Survey
 * Sampling), (sum w)^2 / sum w^2, which equals the row count without weights;
 * null when both sides have enough. O(1).
 */
export function smallSampleWarning(header: MapHeader, effective: RowCounts = header.n): Warning | null {
  const small = smallSampleThreshold(header.d);
  const side = effective.source <= effective.target ? 'source' : 'target';
  const eff = effective[side];
  if (!(eff < small)) return null;
  const rows = header.n[side];
  const weighted = eff < rows - 1e-9;
  return {
    code: 'small-sample',
    message: weighted
      ? `The ${side}'s ${rows} rows carry an effective sample size of only ${eff.toPrecision(3)} because their weights are uneven (Kish: (sum of weights)^2 / sum of squared weights); below ${small} the map is a rough estimate.`
      : `Only ${rows} rows in the ${side}; with fewer than ${small} rows the map is a rough estimate.`,
    action: weighted
      ? 'Add rows if you can, check for a few rows with very large weights, and review mapped values before relying on them.'
      : 'Add rows if you can, and review mapped values before relying on them.',
  };
}

/**
 * Warnings that depend only on sizes and dropped rows, shared by every method.
 * Thresholds are common practice, not theorems: below about 30 rows an
 * empirical quantile function is coarse; in d dimensions a sample needs many
 * more rows than d to pin down covariance, let alone shape. With `effective`
 * (Kish's effective sizes, for weighted rows) the small-sample test uses them
 * instead of row counts; without it, fitMap adds them after the fit.
 */
export function sizeWarnings(header: MapHeader, effective?: RowCounts): Warning[] {
  const out: Warning[] = [];
  const { d, dropped } = header;
  const small = smallSampleWarning(header, effective);
  if (small) out.push(small);
  if (dropped.source + dropped.target > 0) {
    out.push({
      code: 'rows-dropped',
      message: `${dropped.source} source and ${dropped.target} target ${dropped.source + dropped.target === 1 ? 'entry was' : 'entries were'} skipped (blank, text, logical or error cells${d > 1 ? ' drop their whole row' : ''}).`,
      action: 'Check the ranges if you did not expect gaps.',
    });
  }
  return out;
}
