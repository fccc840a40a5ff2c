import type { CostBound, Diagnostics, RowCounts } from '../engine/map';
import { getMethod } from '../engine/methods';
import type { CellOut } from '../input/cells';

/** The cost's relation to the samples' squared W2, as a report cell says it. */
export const BOUND_WORDS: Readonly<Record<CostBound, string>> = Object.freeze({
  exact: 'exact',
  lower: 'lower bound',
  estimate: 'estimate',
});

/**
 * A fitted map's diagnostics as a two-column table (label, value), as
 * REMAP.REPORT spills it and the pane lists it. Numbers stay numbers so that
 * cells can refer to them; absent figures are left out rather than shown as 0.
 * The cost row's label is the cost's own label (what the figure is: exact,
 * a lower bound, an estimate, a displacement), never a bare "squared W2". The
 * table holds fit-time facts only, so it is the same whichever cells applied
 * the map and in what order. O(#settings + #warnings).
 */
export function reportTable(diag: Diagnostics): [string, CellOut][] {
  const rows: [string, CellOut][] = [];
  const add = (label: string, v: CellOut | undefined) => {
    if (v !== undefined && !(typeof v === 'number' && !Number.isFinite(v))) rows.push([label, v]);
  };
  add('Method', diag.method);
  add('What it does', safeSummary(diag.method));
  add('Source rows', diag.n.source);
  add('Target rows', diag.n.target);
  const eff = weightedEffectiveSize(diag);
  if (eff) {
    add('Effective source rows (Kish)', eff.source);
    add('Effective target rows (Kish)', eff.target);
  }
  add('Columns', diag.d);
  if (diag.columns) add('Column names', diag.columns.join(', '));
  add('Source entries skipped', diag.dropped.source);
  add('Target entries skipped', diag.dropped.target);
  const c = diag.cost;
  add(`Cost: ${c.label}`, c.w2Squared);
  add('Cost is', BOUND_WORDS[c.bound] ?? c.bound);
  if (c.units) add('Cost units', c.units === 'raw' ? "the data's own" : 'standardised (each column divided by its pooled spread)');
  add('Square root of the cost', c.w2);
  if (c.w1 !== undefined) add(c.bound === 'exact' ? 'W1, exact' : 'W1', c.w1);
  add('How the cost is computed', c.note);
  add('Energy distance before', diag.energyBefore);
  add('Energy distance after', diag.energyAfter);
  add('Largest KS statistic after', diag.ksMaxAfter);
  if (diag.comparison) add('Rows these were measured on', diag.comparison.note);
  add('Smallest Jacobian eigenvalue', diag.minJacobianEigenvalue);
  if (diag.convergence) {
    add('Converged', diag.convergence.converged);
    add('Iterations', diag.convergence.iterations);
    add(`Final ${diag.convergence.criterion}`, diag.convergence.finalError);
  }
  add('Outside the fitted range', diag.outside);
  if (diag.warnings.length === 0) add('Warnings', 'none');
  for (const w of diag.warnings) add(`Warning (${w.code})`, `${w.message} ${w.action}`);
  add('Reminder', diag.reminder);
  // Settings last: they are also in the formula, and a fixed-height spill cuts from the bottom.
  for (const [k, v] of Object.entries(diag.settings)) add(`Setting: ${k}`, v);
  return rows;
}

/**
 * Kish's effective sizes when the weights make either side's differ from its
 * row count (by more than rounding), else null: unweighted rows would repeat
 * the row counts. O(1).
 * @example weightedEffectiveSize({ n: { source: 10, target: 10 }, effectiveSize: { source: 4, target: 10 } } as Diagnostics) // { source: 4, target: 10 }
 */
export function weightedEffectiveSize(diag: Diagnostics): RowCounts | null {
  const e = diag.effectiveSize;
  if (!e) return null;
  const differs = (eff: number, rows: number) => Math.abs(eff - rows) > 1e-9 * Math.max(1, rows);
  return differs(e.source, diag.n.source) || differs(e.target, diag.n.target) ? e : null;
}

function safeSummary(method: string): string | undefined {
  try {
    return getMethod(method).summary;
  } catch {
    return undefined;
  }
}
