import { compareFit, type Comparisons } from './assess';
import { RemapError } from './errors';
import type { CostReport, Diagnostics, FitRecord, MapJSON, Mapped, MethodName, TransportMap, Warning } from './map';
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
 * Shared bookkeeping for fitted maps: shape checks, the running count of
 * applied rows outside the fitted range, diagnostics and JSON. A method
 * implements `applyPoints`, `invertPoints` and `params`; everything a user sees
 * about a map is assembled here so that all methods report alike.
 */
export abstract class BaseMap implements TransportMap {
  readonly method: MethodName;
  readonly d: number;
  readonly header: MapHeader;
  readonly fitted: FitRecord;
  private appliedRows = 0;
  private appliedOutside = 0;
  private pending: { source: Sample; target: Sample } | null = null;
  private compared: Comparisons | null = null;

  protected constructor(header: MapHeader, fitted: FitRecord) {
    this.header = header;
    this.method = header.method;
    this.d = header.d;
    this.fitted = fitted;
  }

  protected abstract applyPoints(x: Points): Mapped;
  protected abstract invertPoints(y: Points): Mapped;
  /** The method's fitted parameters as plain JSON (numbers finite, arrays plain). */
  protected abstract params(): unknown;

  apply(x: Points): Mapped {
    this.checkShape(x, 'apply');
    const r = this.applyPoints(x);
    this.appliedRows += x.n;
    this.appliedOutside += r.outside;
    return r;
  }

  invert(y: Points): Mapped {
    this.checkShape(y, 'invert');
    const r = this.invertPoints(y);
    this.appliedRows += y.n;
    this.appliedOutside += r.outside;
    return r;
  }

  cost(): CostReport {
    return this.fitted.cost;
  }

  /**
   * Keeps the fitted samples so that the energy distances and KS statistic
   * (assess.ts) can be computed when diagnostics or JSON are first asked for,
   * rather than slowing every fit. A no-op when the method recorded them itself.
   * The samples are held by reference: the engine never mutates them.
   */
  attachSamples(source: Sample, target: Sample): void {
    if (this.fitted.energyAfter === undefined && this.fitted.ksMaxAfter === undefined) this.pending = { source, target };
  }

  /** The fit record with any comparisons computed since fitting. */
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
    return this.compared ? { ...this.fitted, ...this.compared } : this.fitted;
  }

  diagnostics(): Diagnostics {
    const fitted = this.record();
    const warnings: Warning[] = [...fitted.warnings];
    if (this.appliedOutside > 0) {
      const share = this.appliedOutside / Math.max(1, this.appliedRows);
      warnings.push({
        code: 'extrapolation',
        message: `${this.appliedOutside} of ${this.appliedRows} mapped rows (${(100 * share).toFixed(1)}%) lay outside the range the map was fitted on; their results are extrapolated (tails: ${String(this.header.settings.tails ?? 'clamp')}).`,
        action: 'Treat those results with caution, or fit on data that covers them.',
      });
    }
    return {
      method: this.method,
      settings: this.header.settings,
      n: this.header.n,
      d: this.d,
      columns: this.header.columns,
      dropped: this.header.dropped,
      cost: fitted.cost,
      energyBefore: fitted.energyBefore,
      energyAfter: fitted.energyAfter,
      ksMaxAfter: fitted.ksMaxAfter,
      minJacobianEigenvalue: fitted.minJacobianEigenvalue,
      convergence: fitted.convergence,
      applied: { rows: this.appliedRows, outside: this.appliedOutside },
      warnings,
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
      throw new RemapError(`${verb}: the values have ${x.d} column${x.d === 1 ? '' : 's'} but the ${this.method} map was fitted on ${this.d}; give values with ${this.d} column${this.d === 1 ? '' : 's'}.`);
    }
  }
}

/**
 * Warnings that depend only on sizes and dropped rows, shared by every method.
 * Thresholds are common practice, not theorems: below about 30 rows an
 * empirical quantile function is coarse; in d dimensions a sample needs many
 * more rows than d to pin down covariance, let alone shape.
 */
export function sizeWarnings(header: MapHeader): Warning[] {
  const out: Warning[] = [];
  const { n, d, dropped } = header;
  const small = d === 1 ? 30 : Math.max(30, 10 * d);
  const smallest = Math.min(n.source, n.target);
  if (smallest < small) {
    out.push({
      code: 'small-sample',
      message: `Only ${smallest} rows in the ${n.source <= n.target ? 'source' : 'target'}; with fewer than ${small} rows the map is a rough estimate.`,
      action: 'Add rows if you can, and review mapped values before relying on them.',
    });
  }
  if (dropped.source + dropped.target > 0) {
    out.push({
      code: 'rows-dropped',
      message: `${dropped.source} source and ${dropped.target} target ${dropped.source + dropped.target === 1 ? 'entry was' : 'entries were'} skipped (blank, text, logical or error cells${d > 1 ? ' drop their whole row' : ''}).`,
      action: 'Check the ranges if you did not expect gaps.',
    });
  }
  return out;
}
