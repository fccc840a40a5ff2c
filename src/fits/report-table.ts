import type { Diagnostics } from '../engine/map';
import { getMethod } from '../engine/methods';
import type { CellOut } from '../input/cells';

/**
 * A fitted map's diagnostics as a two-column table (label, value), as
 * REMAP.REPORT spills it and the pane lists it. Numbers stay numbers so that
 * cells can refer to them; absent figures are left out rather than shown as 0.
 * O(#settings + #warnings).
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
  add('Columns', diag.d);
  if (diag.columns) add('Column names', diag.columns.join(', '));
  add('Source entries skipped', diag.dropped.source);
  add('Target entries skipped', diag.dropped.target);
  add('Cost: squared W2', diag.cost.w2Squared);
  add('Cost: W2', diag.cost.w2);
  add('Cost: W1', diag.cost.w1);
  add('How the cost is computed', diag.cost.note);
  add('Energy distance before', diag.energyBefore);
  add('Energy distance after', diag.energyAfter);
  add('Largest KS statistic after', diag.ksMaxAfter);
  add('Smallest Jacobian eigenvalue', diag.minJacobianEigenvalue);
  if (diag.convergence) {
    add('Converged', diag.convergence.converged);
    add('Iterations', diag.convergence.iterations);
    add(`Final ${diag.convergence.criterion}`, diag.convergence.finalError);
  }
  for (const [k, v] of Object.entries(diag.settings)) add(`Setting: ${k}`, v);
  if (diag.warnings.length === 0) add('Warnings', 'none');
  for (const w of diag.warnings) add(`Warning (${w.code})`, `${w.message} ${w.action}`);
  return rows;
}

function safeSummary(method: string): string | undefined {
  try {
    return getMethod(method).summary;
  } catch {
    return undefined;
  }
}
