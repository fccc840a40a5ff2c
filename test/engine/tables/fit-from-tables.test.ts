import { parseMapJSON } from '../../../src/engine/map-json';
import { fitMapSync, restoreMap } from '../../../src/engine/methods';
import { column } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';
import { fitFromTables } from '../../../src/engine/tables/fit-from-tables';
import { frequencyTable } from '../../../src/engine/tables/frequency-table';
import { tableInterpolationError } from '../../../src/engine/tables/interpolation-error';
import { quantileTable } from '../../../src/engine/tables/quantile-table';

// Source: Abramowitz & Stegun (1964), "Handbook of Mathematical Functions", Table 26.1,
// the normal probability function P(x), to 15 decimals; P(-x) = 1 - P(x) (26.2.5).
const AS_26_1: Record<string, number> = {
  '0': 0.5,
  '0.25': 0.598706325682924,
  '0.5': 0.691462461274013,
  '0.75': 0.773372647623132,
  '1': 0.841344746068543,
  '1.25': 0.894350226333145,
  '1.5': 0.933192798731142,
  '1.75': 0.959940843136183,
  '2': 0.977249868051821,
  '2.25': 0.987775527344955,
  '2.5': 0.993790334674224,
  '2.75': 0.997020236764945,
  '3': 0.99865010196837,
};
const P = (x: number): number => (x >= 0 ? AS_26_1[String(x)] : 1 - AS_26_1[String(-x)]);

/** The standard normal quantile table at x = -3, -2.5, ..., 3 (13 points). */
function normalTable() {
  const xs = [-3, -2.5, -2, -1.5, -1, -0.5, 0, 0.5, 1, 1.5, 2, 2.5, 3];
  return { xs, table: quantileTable(xs.map(P), xs, 'target table') };
}
const uniform = { kind: 'quantiles' as const, table: quantileTable([0, 1], [0, 1], 'source table') };

describe('fitFromTables: quantile and frequency tables as source or target', () => {
  test('a uniform source maps onto a normal quantile table exactly at its points, and between them within the stated error', () => {
    const { xs, table } = normalTable();
    const map = fitFromTables('quantile', uniform, { kind: 'quantiles', table });
    const at = map.apply(column(xs.map(P))).data;
    // Source: the table itself (A&S 26.1): at the table's probabilities the map gives its quantiles.
    xs.forEach((x, k) => expect(at[k]).toBeCloseTo(x, 12));
    const err = tableInterpolationError(table);
    const mids = [-2.75, -2.25, -1.75, -1.25, -0.75, -0.25, 0.25, 0.75, 1.25, 1.75, 2.25, 2.75];
    const got = map.apply(column(mids.map(P))).data;
    mids.forEach((x, j) => {
      const step = xs.findIndex((v, k) => v < x && xs[k + 1] > x);
      const off = Math.abs(got[j] - x);
      // Source: A&S 26.1 gives the true quantile x at P(x); the stated error is this table's estimate.
      expect(off).toBeLessThanOrEqual(err.perStep[step]);
      expect(off).toBeGreaterThan(0); // the linear reading is not the normal curve: the bound has something to bound
    });
    // Between points the quantile function is read linearly in probability (stated rule; design choice).
    const p = (P(0.5) + P(1)) / 2;
    expect(map.apply(column([p])).data[0]).toBeCloseTo(0.75, 12);
  });

  test('beyond the table: hold keeps the end values; extend continues the end steps; both warn', () => {
    const { table } = normalTable();
    const hold = fitFromTables('quantile', uniform, { kind: 'quantiles', table });
    // Design choice: below the first probability (0.00135) the map holds the first value -3.
    expect(Array.from(hold.apply(column([0.0001, 0.9999])).data)).toEqual([-3, 3]);
    expect(hold.diagnostics().warnings.map((w) => w.code)).toContain('extrapolation');
    expect(hold.diagnostics().warnings.find((w) => w.code === 'extrapolation')!.message).toMatch(
      /first probability 0\.00135.*holds the table's end values \(-3 and 3\)/,
    );
    const ext = fitFromTables('quantile', uniform, { kind: 'quantiles', table }, {}, 'extend');
    // Extending the first step (P(-3), -3)-(P(-2.5), -2.5) to probability 0.0001, by the straight-line rule.
    const slope = 0.5 / (P(-2.5) - P(-3));
    expect(ext.apply(column([0.0001])).data[0]).toBeCloseTo(-3 - slope * (P(-3) - 0.0001), 10);
    expect(ext.diagnostics().warnings.find((w) => w.code === 'extrapolation')!.message).toMatch(/extrapolation/);
  });

  test('a coarse table is flagged with its estimated error; the map JSON round trip is bit-identical', () => {
    const { table } = normalTable();
    const map = fitFromTables('quantile', uniform, { kind: 'quantiles', table });
    const coarse = map.diagnostics().warnings.filter((w) => w.code === 'small-sample');
    expect(coarse.map((w) => w.message)).toEqual([
      expect.stringMatching(/source quantile table is coarse \(2 points/),
      expect.stringMatching(/target quantile table is coarse \(13 points/),
    ]);
    expect(map.cost().note).toMatch(/quantile table read linearly between its 13 points/);
    const text = JSON.stringify(map.toJSON());
    const restored = restoreMap(parseMapJSON(text));
    expect(JSON.stringify(restored.toJSON())).toBe(text);
    const x = column([0.01, 0.3, 0.5, 0.77]);
    expect(Array.from(restored.apply(x).data)).toEqual(Array.from(map.apply(x).data));
    expect(Array.from(restored.invert(x).data)).toEqual(Array.from(map.invert(x).data));
  });

  test.each(['quantile', 'step', 'ordinal'])('%s: a frequency table of scores gives the same map as the scores written out row by row', (method) => {
    const scores = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const counts = [3, 0, 7, 12, 20, 31, 25, 14, 9, 4, 1];
    const rows = scores.flatMap((s, k) => Array(counts[k]).fill(s));
    const r = new Random(3);
    const src = Array.from({ length: 150 }, () => Math.floor(r.uniform() * 11));
    const fromTable = fitFromTables(
      method,
      { kind: 'sample', sample: { n: 150, d: 1, data: Float64Array.from(src), weights: null } },
      { kind: 'frequencies', table: frequencyTable(scores, counts, 'target table') },
    );
    const fromRows = fitMapSync(
      method,
      { n: 150, d: 1, data: Float64Array.from(src), weights: null },
      { n: rows.length, d: 1, data: Float64Array.from(rows), weights: null },
    );
    const x = column([0, 0.5, 1, 2, 3.2, 5, 7, 9.9, 10]);
    // Source: the definition of a frequency table (each value counted as often as its count).
    expect(Array.from(fromTable.apply(x).data)).toEqual(Array.from(fromRows.apply(x).data));
    expect(Array.from(fromTable.invert(x).data)).toEqual(Array.from(fromRows.invert(x).data));
    expect(fromTable.diagnostics().n.target).toBe(126); // the total count is the row count
    expect(fromTable.cost().w2Squared).toBe(fromRows.cost().w2Squared);
  });

  test('a map fitted from a percentile table of a sample stays within the stated error of the map fitted from the sample', () => {
    const r = new Random(21);
    const n = 2000;
    const src = Float64Array.from({ length: n }, () => r.normal());
    const tgt = Float64Array.from({ length: n }, () => Math.exp(0.4 * r.normal()));
    const sorted = Float64Array.from(tgt).sort();
    // Hazen quantiles of the target (Hyndman & Fan 1996, definition 5): Q(p) at position n p + 0.5, what
    // `SELECT quantile_cont` would give with that definition; 99 percentiles, as an agency might publish.
    const ps = Array.from({ length: 99 }, (_, k) => (k + 1) / 100);
    const qs = ps.map((p) => {
      const h = n * p + 0.5;
      const lo = Math.floor(h);
      return sorted[lo - 1] + (h - lo) * (sorted[lo] - sorted[lo - 1]);
    });
    const table = quantileTable(ps, qs, 'target table');
    const viaTable = fitFromTables('quantile', { kind: 'sample', sample: { n, d: 1, data: src, weights: null } }, { kind: 'quantiles', table });
    const viaRows = fitMapSync('quantile', { n, d: 1, data: src, weights: null }, { n, d: 1, data: tgt, weights: null });
    const sortedSrc = Float64Array.from(src).sort();
    const inside = sortedSrc.subarray(40, n - 40); // source rows whose share lies within the table's 0.01..0.99 (with margin)
    const a = viaTable.apply(column(inside)).data;
    const b = viaRows.apply(column(inside)).data;
    const err = tableInterpolationError(table);
    // The sample's own curve wiggles between the table's points by sampling noise as well as curvature:
    // the gap is bounded by the curvature estimate plus the largest gap between neighbouring target values
    // inside a step (stated in the README as the error of fitting from a table of a sample).
    let spacing = 0;
    for (let i = 21; i < n - 21; i++) spacing = Math.max(spacing, sorted[i] - sorted[i - 1]);
    let worst = 0;
    for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
    expect(worst).toBeLessThanOrEqual(err.largest + spacing);
  });

  test('bad tables are refused with what to fix', () => {
    expect(() => quantileTable([0.1, 0.5], [1, 2, 3], 't')).toThrow(/2 probabilities but 3 values/);
    expect(() => quantileTable([10, 50], [1, 2], 't')).toThrow(/give probabilities as shares \(0\.25, not 25\)/);
    expect(() => quantileTable([0.5, 0.1], [1, 2], 't')).toThrow(/not larger than the one before/);
    expect(() => quantileTable([0.1, 0.5], [2, 2], 't')).toThrow(/frequency table/);
    expect(() => frequencyTable([1, 2], [1, -1], 't')).toThrow(/negative/);
    const { table } = normalTable();
    expect(() => fitFromTables('step', uniform, { kind: 'quantiles', table })).toThrow(/only method quantile reads/);
  });
});
