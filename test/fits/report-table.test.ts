import * as F from '../../src/functions/functions';
import { fitMapSync } from '../../src/engine/methods';
import type { Sample } from '../../src/engine/points';
import { forgetAll } from '../../src/fits';
import { reportTable } from '../../src/fits/report-table';
import { installCustomFunctionsStub } from '../helpers/custom-functions-stub';

installCustomFunctionsStub();
afterEach(() => forgetAll());

const col = (xs: number[]) => xs.map((x) => [x]) as unknown as any[][];
const sample = (xs: number[], weights: number[] | null = null, d = 1): Sample => ({
  n: xs.length / d,
  d,
  data: Float64Array.from(xs),
  weights: weights ? Float64Array.from(weights) : null,
});
const get = (table: [string, unknown][], label: string) => table.find((r) => r[0] === label)?.[1];

/** Two columns, 12 rows, neither constant nor collinear (invented). */
const SRC2 = [0, 1, 1, 0, 2, 3, 3, 1, 4, 4, 5, 2, 6, 7, 7, 5, 8, 6, 9, 9, 10, 8, 11, 12];
const TGT2 = [5, 2, 6, 1, 8, 4, 9, 7, 3, 3, 12, 10, 4, 8, 15, 11, 6, 5, 10, 14, 7, 13, 14, 12];

describe('REMAP.REPORT: every number says what it is', () => {
  test('one column with quantile: the cost row says exact, and holds the squared W2 worked by hand', () => {
    const table = reportTable(fitMapSync('quantile', sample([1, 2, 3]), sample([10, 20, 30])).diagnostics());
    // Source: worked by hand: sorted matching (1,2,3) -> (10,20,30) moves 9, 18, 27: (81 + 324 + 729) / 3 = 378
    expect(get(table, 'Cost: squared W2, exact')).toBeCloseTo(378, 10);
    expect(get(table, 'Cost is')).toBe('exact');
  });

  test('linear: the cost row is labelled a lower bound, never a bare "squared W2"', () => {
    const table = reportTable(fitMapSync('linear', sample(SRC2, null, 2), sample(TGT2, null, 2)).diagnostics());
    const costRow = table.find((r) => r[0].startsWith('Cost: '));
    // Source: design choice (Gelbrich 1990: the Gaussian figure is a lower bound on the samples' squared W2, so the label says so)
    expect(costRow?.[0]).toMatch(/lower bound/);
    expect(get(table, 'Cost is')).toBe('lower bound');
    expect(table.map((r) => r[0])).not.toContain('Cost: squared W2');
  });

  test('quantile on several columns: the per-column sum is labelled a lower bound', () => {
    const table = reportTable(fitMapSync('quantile', sample(SRC2, null, 2), sample(TGT2, null, 2)).diagnostics());
    // Source: design choice (the sum of the columns' 1-D costs ignores dependence, so it bounds the joint cost from below)
    expect(get(table, 'Cost is')).toBe('lower bound');
  });

  test('with uneven weights the effective sizes (Kish) are listed; without weights they are not', () => {
    const weighted = reportTable(fitMapSync('quantile', sample([1, 2, 3, 4, 5], [1, 1, 1, 1, 4]), sample([1, 2, 3, 4, 5])).diagnostics());
    // Source: Kish (1965): (sum w)^2 / sum w^2 = 8^2 / (1 + 1 + 1 + 1 + 16) = 64 / 20 = 3.2, worked by hand
    expect(get(weighted, 'Effective source rows (Kish)')).toBeCloseTo(3.2, 12);
    expect(get(weighted, 'Effective target rows (Kish)')).toBeCloseTo(5, 12);
    const plain = reportTable(fitMapSync('quantile', sample([1, 2, 3, 4, 5]), sample([1, 2, 3, 4, 5])).diagnostics());
    // Source: design choice (an unweighted effective size repeats the row count, so it is left out)
    expect(plain.map((r) => r[0])).not.toContain('Effective source rows (Kish)');
  });

  test('lists the rows the comparison used, what happens outside the fitted range, and the reminder', () => {
    const table = reportTable(fitMapSync('quantile', sample([1, 2, 3, 4, 5]), sample([2, 4, 6, 8, 10])).diagnostics());
    // Source: design choice (each map's own figures are measured on its fitting rows, and the report says so)
    expect(get(table, 'Rows these were measured on')).toMatch(/own fitting rows \(5 source, 5 target\)/);
    // Source: design choice (the default tails=clamp, said in words)
    expect(get(table, 'Outside the fitted range')).toMatch(/clamped/);
    expect(get(table, 'Reminder')).toMatch(/held-out data/);
  });

  test('a report on a handle is the same before and after cells applied the map to values outside its range, in any order', async () => {
    const h = await F.fit(col([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]), col([10, 20, 30, 40, 50, 60, 70, 80, 90, 100]));
    const before = await F.report(h);
    await F.apply(h, col([11, 0]), { address: 'Sheet1!C1' } as CustomFunctions.Invocation);
    await F.invert(h, col([500]), { address: 'Sheet1!D1' } as CustomFunctions.Invocation);
    await F.apply(h, col([5]));
    const after = await F.report(h);
    // Source: design choice (a report holds fit-time facts only)
    expect(after).toEqual(before);
    expect(JSON.stringify(after)).not.toMatch(/extrapolation/);
  });
});
