import { RemapError } from '../engine/errors';
import type { GivenMoments } from '../engine/linear/from-moments';
import { csvCell, parseCSV } from './csv';

/**
 * Reads a summary file for the linear map (our format): a header row naming
 * the columns after a first label column, then rows labelled
 *   n      the number of rows summarised (first value only; others may be blank),
 *   mean   one mean per column,
 *   cov    d rows, the covariance matrix row by row (divided by n, not n - 1: covar_pop in SQL),
 *   min, max  (optional) each column's range, for counting rows outside it.
 * Labels are case-insensitive; row order is free except that the cov rows keep
 * the columns' order. The text is comma-separated CSV (other dialects are
 * converted before). O(d^2).
 * @throws RemapError naming the file, the row and what to fix.
 * @example readMomentsCSV('stat,a\nn,100\nmean,2\ncov,4\n', 'S.csv') // { columns: ['a'], moments: { n: 100, mean: [2], cov: [4] } }
 */
export function readMomentsCSV(text: string, name: string): { columns: string[]; moments: GivenMoments } {
  const rows = parseCSV(text, name);
  if (rows.length < 2)
    throw new RemapError(`${name}: a summary needs a header row and rows labelled n, mean and cov; see the README, "Fitting from summaries".`);
  const columns = rows[0].slice(1).map((c) => c.trim());
  const d = columns.length;
  if (d < 1) throw new RemapError(`${name}: the header names no column after the label column; write e.g. "stat,a,b".`);
  let n: number | undefined;
  let mean: number[] | undefined;
  let min: number[] | undefined;
  let max: number[] | undefined;
  const cov: number[] = [];
  const numbers = (r: string[], line: number, count: number): number[] => {
    const out: number[] = [];
    for (let k = 1; k <= count; k++) {
      const v = csvCell(r[k] ?? '');
      if (typeof v !== 'number' || !Number.isFinite(v))
        throw new RemapError(`${name}, line ${line}, column ${columns[k - 1]}: "${r[k] ?? ''}" is not a finite number; give one.`);
      out.push(v);
    }
    return out;
  };
  for (let i = 1; i < rows.length; i++) {
    const label = rows[i][0].trim().toLowerCase();
    const line = i + 1;
    if (label === 'n') n = numbers(rows[i], line, 1)[0];
    else if (label === 'mean') mean = numbers(rows[i], line, d);
    else if (label === 'cov') cov.push(...numbers(rows[i], line, d));
    else if (label === 'min') min = numbers(rows[i], line, d);
    else if (label === 'max') max = numbers(rows[i], line, d);
    else if (label !== '')
      throw new RemapError(`${name}, line ${line}: the label "${rows[i][0]}" is not one of n, mean, cov, min, max; fix or remove that row.`);
  }
  if (n === undefined) throw new RemapError(`${name}: no row labelled n (the number of rows summarised); add one.`);
  if (!mean) throw new RemapError(`${name}: no row labelled mean; add the column means.`);
  if (cov.length !== d * d)
    throw new RemapError(`${name}: ${cov.length / d} rows labelled cov, but the covariance of ${d} columns needs ${d}; give the whole matrix.`);
  return { columns, moments: { n, mean, cov, min, max } };
}
