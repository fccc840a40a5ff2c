import type { Diagnostics, Warning } from '../engine/map';

/**
 * A fitted map's diagnostics said in plain sentences for the pane: what was
 * moved onto what, the cost, how close the mapped source came to the target,
 * whether the map is certified monotone, and whether the fit converged. Pure;
 * O(#columns + #warnings).
 * @example diagnosticsInWords(map.diagnostics())[0] // 'Moved 500 source rows onto 600 target rows (2 columns: income, age) with the entropic method.'
 */
export function diagnosticsInWords(d: Diagnostics): string[] {
  const out: string[] = [];
  const cols = d.columns ? `${d.d} column${d.d === 1 ? '' : 's'}: ${d.columns.join(', ')}` : `${d.d} column${d.d === 1 ? '' : 's'}`;
  out.push(`Moved ${count(d.n.source)} source rows onto ${count(d.n.target)} target rows (${cols}) with the ${d.method} method.`);
  if (d.dropped.source + d.dropped.target > 0) {
    out.push(`${count(d.dropped.source)} source and ${count(d.dropped.target)} target entries were skipped (blank, text, logical or error cells).`);
  }
  out.push(`Transport cost: squared W2 = ${num(d.cost.w2Squared)} (W2 = ${num(d.cost.w2)}, the typical distance a value moves). ${d.cost.note}`);
  if (d.energyBefore !== undefined && d.energyAfter !== undefined) {
    const drop = d.energyBefore > 0 ? Math.round(100 * (1 - d.energyAfter / d.energyBefore)) : null;
    out.push(
      `Energy distance to the target: ${num(d.energyBefore)} before mapping, ${num(d.energyAfter)} after (0 means the same ` +
        `distribution${drop !== null ? `; ${drop}% of the gap closed` : ''}).`,
    );
  }
  if (d.ksMaxAfter !== undefined) {
    out.push(
      `After mapping, the mapped source's share below any value differs from the target's by at most ${pct(d.ksMaxAfter)} in each column (largest ` +
        `KS statistic ${num(d.ksMaxAfter)}).`,
    );
  }
  if (d.minJacobianEigenvalue !== undefined) {
    out.push(
      d.minJacobianEigenvalue >= 0
        ? `The map keeps the order of values on the source rows (smallest Jacobian eigenvalue ${num(d.minJacobianEigenvalue)}, not negative).`
        : `The map is not certified to keep order everywhere (smallest Jacobian eigenvalue ${num(d.minJacobianEigenvalue)} is negative).`,
    );
  }
  if (d.convergence) {
    const c = d.convergence;
    out.push(
      c.converged
        ? `It converged after ${count(c.iterations)} iterations (final ${c.criterion} ${num(c.finalError)}).`
        : `It did not converge within ${count(c.iterations)} iterations (final ${c.criterion} ${num(c.finalError)}).`,
    );
  }
  return out;
}

/**
 * Warnings as the pane lists them: the caution, then what to do. Pure; O(#warnings).
 * @example warningsInWords([{ code: 'small-sample', message: 'Only 12 rows.', action: 'Add rows.' }]) // [{ title: 'Small sample', text: 'Only 12
 * rows.', action: 'Add rows.' }]
 */
export function warningsInWords(ws: readonly Warning[]): { title: string; text: string; action: string }[] {
  return ws.map((w) => ({ title: TITLES[w.code] ?? w.code, text: w.message, action: w.action }));
}

const TITLES: Record<string, string> = {
  'small-sample': 'Small sample',
  'rows-dropped': 'Entries skipped',
  extrapolation: 'Values outside the fitted range',
  'not-converged': 'Did not converge',
  'singular-covariance': 'Columns nearly dependent',
  'ridge-added': 'Ridge added',
  'marginals-only': 'Columns matched one by one',
  ties: 'Tied values',
  'source-rows-only': 'Maps the source rows only',
  'time-budget': 'Stopped at the time budget',
  'unequal-sizes': 'Samples of different sizes',
};

function count(n: number): string {
  return n.toLocaleString('en-US');
}

/** A number with 4 significant digits, in plain or exponent form. */
export function num(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  return Math.abs(v) >= 1e5 || Math.abs(v) < 1e-3 ? v.toExponential(3) : String(Number(v.toPrecision(4)));
}

function pct(share: number): string {
  return `${Number((100 * share).toPrecision(3))} percentage points`;
}
