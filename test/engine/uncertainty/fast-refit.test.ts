import { fitMapSync } from '../../../src/engine/methods';
import { column, type Sample } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';
import { AliasTable } from '../../../src/engine/uncertainty/alias-table';
import { bootstrapReplicates } from '../../../src/engine/uncertainty/bootstrap-replicates';
import { ReplicateFitter, type BoundedMethod } from '../../../src/engine/uncertainty/replicate-fitter';
import { QuantileAtValues } from '../../../src/engine/uncertainty/quantile-at-values';
import { ResampleStream } from '../../../src/engine/uncertainty/resample-stream';
import { StepAtValues } from '../../../src/engine/uncertainty/step-at-values';
import { sortWithOrder } from '../../../src/engine/stats/sort';
import { knotUnits } from '../../../src/engine/uncertainty/knot-units';

/** Equal to 1e-12 relative (NaN where the other is NaN). */
function expectSame(a: ArrayLike<number>, b: ArrayLike<number>): void {
  expect(a.length).toBe(b.length);
  for (let k = 0; k < a.length; k++) {
    if (Number.isNaN(b[k])) expect(a[k]).toBeNaN();
    else expect(Math.abs(a[k] - b[k])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(b[k])));
  }
}

/** Running totals. */
function running(w: Float64Array): Float64Array {
  let t = 0;
  return Float64Array.from(w, (v) => (t += v));
}

/** A sample of n values: continuous, or rounded to `step` (ties), with or without weights. */
function draw(r: Random, n: number, scale: number, shift: number, step: number, weighted: boolean): Sample {
  const data = Float64Array.from({ length: n }, () => {
    const v = shift + scale * r.normal();
    return step > 0 ? Math.round(v / step) * step : v;
  });
  return { n, d: 1, data, weights: weighted ? Float64Array.from({ length: n }, () => 0.2 + 2 * r.uniform()) : null };
}

/** The rows of s repeated counts[i] times: the resampled data a user would refit on. */
function repeatRows(s: Sample, counts: ArrayLike<number>): Sample {
  const rows: number[] = [];
  for (let i = 0; i < s.n; i++) for (let c = 0; c < counts[i]; c++) for (let k = 0; k < s.d; k++) rows.push(s.data[i * s.d + k]);
  return { n: rows.length / s.d, d: s.d, data: Float64Array.from(rows), weights: null };
}

const cases: { method: BoundedMethod; tails: 'clamp' | 'linear'; step: number }[] = [
  { method: 'quantile', tails: 'clamp', step: 0 },
  { method: 'quantile', tails: 'linear', step: 0 },
  { method: 'quantile', tails: 'linear', step: 0.5 },
  { method: 'step', tails: 'clamp', step: 0 },
  { method: 'step', tails: 'linear', step: 0.5 },
  { method: 'ordinal', tails: 'linear', step: 1 },
];

describe('the fast refits of bootstrap replicates', () => {
  // Design choice: the fast readers must give the numbers of the method's own fit on the resampled rows
  // (the definition of a bootstrap replicate: Efron 1979), to rounding.
  test.each(cases)('$method ($tails tails, values rounded to $step): the full fit on the resampled rows, row for row', ({ method, tails, step }) => {
    const r = new Random(31);
    for (let trial = 0; trial < 40; trial++) {
      const n = 3 + Math.floor(r.uniform() * 30);
      const m = trial % 3 === 0 ? n : 3 + Math.floor(r.uniform() * 30);
      const src = draw(r, n, 2, 5, step, false);
      const tgt = draw(r, m, 3, 20, step, false);
      const lo = Math.min(...src.data);
      const hi = Math.max(...src.data);
      // Inside, at and beyond the source range, and at sample values themselves.
      const x = column([lo - 1.5, lo, (lo + hi) / 2, hi, hi + 2, src.data[0], src.data[1], lo + 0.3 * (hi - lo), lo + 0.71 * (hi - lo)]);
      const fitter = new ReplicateFitter(method, src, tgt, x, { tails });
      const { sorted, order } = sortWithOrder(x.data);
      for (let k = 0; k < 5; k++) {
        const cs = Float64Array.from({ length: n }, () => Math.floor(r.uniform() * 3));
        const ct = Float64Array.from({ length: m }, () => Math.floor(r.uniform() * 3));
        let expected: Float64Array | null = null;
        try {
          expected = fitMapSync(method, repeatRows(src, cs), repeatRows(tgt, ct), { tails }).apply(x).data;
        } catch {
          expected = null; // too few distinct values drawn: the fast way must refuse too
        }
        const out = new Float64Array(x.n);
        const sw = fitter.perUnit('source', cs);
        const tw = fitter.perUnit('target', ct);
        // The readers themselves (not their fallback, the general refit): quantile and step read the counts' running totals.
        const sides = fitter.sides!;
        const run =
          method === 'quantile'
            ? () =>
                expect(new QuantileAtValues(sides.source.distinct, sides.target.distinct, sorted, order).map(running(sw), running(tw), tails, out)).toBe(true)
            : method === 'step'
              ? () => new StepAtValues(sides.source.distinct, sides.target.distinct, sorted, order).map(running(sw), running(tw), tails, out)
              : () => fitter.mapWith(sw, tw, out);
        if (expected === null) expect(run).toThrow();
        else {
          run();
          expectSame(out, expected);
        }
      }
    }
  });

  test.each(['quantile', 'step'] as const)('%s with replicate weights (fractions, some zero): the full fit with those weights', (method) => {
    const r = new Random(77);
    for (let trial = 0; trial < 30; trial++) {
      const src = draw(r, 5 + Math.floor(r.uniform() * 25), 2, 5, trial % 2 ? 0.5 : 0, false);
      const tgt = draw(r, 5 + Math.floor(r.uniform() * 25), 3, 20, trial % 2 ? 0.5 : 0, false);
      const x = column([0, 3, 4.4, 5, 5.5, 7, 12]);
      const fitter = new ReplicateFitter(method, src, tgt, x, { tails: 'linear' });
      const weights = (n: number) => Float64Array.from({ length: n }, () => (r.uniform() < 0.2 ? 0 : 0.1 + 3 * r.uniform()));
      const ws = weights(src.n);
      const wt = weights(tgt.n);
      let expected: Float64Array | null = null;
      try {
        expected = fitMapSync(method, { ...src, weights: ws }, { ...tgt, weights: wt }, { tails: 'linear' }).apply(x).data;
      } catch {
        expected = null;
      }
      const out = new Float64Array(x.n);
      const run = () => fitter.mapWith(fitter.perUnit('source', ws), fitter.perUnit('target', wt), out);
      if (expected === null) expect(run).toThrow();
      else {
        run();
        expectSame(out, expected);
      }
    }
  });

  test('source values one unit in the last place apart: the quantile reader declines, and the fallback gives the full fit', () => {
    // Between values 2^-52 apart, knots interpolated at the target's positions round onto each other and the knot
    // builder drops them; the reader cannot follow that and must say so (design choice: refit then).
    const e = 2 ** -52;
    const src = { n: 6, d: 1, data: Float64Array.from({ length: 6 }, (_, i) => 1 + i * e), weights: null };
    const tgt = { n: 17, d: 1, data: Float64Array.from({ length: 17 }, (_, i) => 10 + i), weights: null };
    const x = column([1, 1 + e, 1 + 2 * e, 1 + 3 * e, 1 + 5 * e, 0.5, 2]);
    const fitter = new ReplicateFitter('quantile', src, tgt, x, { tails: 'linear' });
    const { sorted, order } = sortWithOrder(x.data);
    const reader = new QuantileAtValues(fitter.sides!.source.distinct, fitter.sides!.target.distinct, sorted, order);
    const ones = (k: number) => new Float64Array(k).fill(1);
    expect(reader.map(running(ones(6)), running(ones(17)), 'linear', new Float64Array(x.n))).toBe(false);
    const out = new Float64Array(x.n);
    fitter.mapWith(ones(6), ones(17), out);
    expectSame(out, fitMapSync('quantile', src, tgt, { tails: 'linear' }).apply(x).data);
  });

  test('linear: the full fit on the resampled rows (two columns, standardised and raw units, with a ridge)', () => {
    const r = new Random(4);
    for (const settings of [{}, { units: 'raw' }, { ridge: 0.01 }]) {
      const n = 25;
      const mk = (a: number) => ({ n, d: 2, data: Float64Array.from({ length: 2 * n }, (_, i) => a * r.normal() + (i % 2) * 100), weights: null });
      const src = mk(1);
      const tgt = mk(3);
      const x = { n: 3, d: 2, data: Float64Array.of(0, 100, 1, 99, -2, 104) };
      const fitter = new ReplicateFitter('linear', src, tgt, x, fitMapSync('linear', src, tgt, settings).diagnostics().settings);
      for (let k = 0; k < 5; k++) {
        const cs = Float64Array.from({ length: n }, () => Math.floor(r.uniform() * 3));
        const ct = Float64Array.from({ length: n }, () => Math.floor(r.uniform() * 3));
        const out = new Float64Array(6);
        fitter.mapWith(cs, ct, out);
        expectSame(out, fitMapSync('linear', repeatRows(src, cs), repeatRows(tgt, ct), settings).apply(x).data);
      }
    }
  });

  test.each(['quantile', 'step', 'ordinal', 'linear'] as const)(
    '%s: bootstrap replicates by the fast way equal those by the general refit, draw for draw',
    (method) => {
      const r = new Random(12);
      for (const [weighted, step] of [
        [false, 0],
        [false, 1],
        [true, 0],
        [true, 1],
      ] as const) {
        const src = draw(r, 60, 2, 5, method === 'ordinal' ? 1 : step, weighted);
        const tgt = draw(r, 45, 3, 20, method === 'ordinal' ? 1 : step, weighted);
        const x = column([-3, 2, 4.5, 5, 6.2, 9, 14]);
        const settings: Record<string, string | number> = method === 'linear' ? { ridge: 0, units: 'standardised' } : { tails: 'linear' };
        const fitter = new ReplicateFitter(method, src, tgt, x, settings);
        const fast = bootstrapReplicates(fitter, src, tgt, 30, x.n, 3, 'fast');
        const slow = bootstrapReplicates(fitter, src, tgt, 30, x.n, 3, 'refit');
        expect(fast.failed).toBe(slow.failed);
        expectSame(fast.reps, slow.reps);
      }
    },
  );
});

describe('the resampling stream', () => {
  // Source: the chi-square distribution with 9 degrees of freedom has its 0.999 quantile at 27.877
  // (Abramowitz & Stegun 1964, Table 26.8; from memory, checked against standard tables).
  const CHI2_9_999 = 27.877;
  const chi2 = (counts: ArrayLike<number>, expected: ArrayLike<number>) => {
    let s = 0;
    for (let k = 0; k < counts.length; k++) s += (counts[k] - expected[k]) ** 2 / expected[k];
    return s;
  };

  test('uniform draws fill ten cells alike (chi-square test at 0.1 %)', () => {
    const counts = new Int32Array(10);
    new ResampleStream(5).uniformCounts(10, 100_000, counts);
    expect(counts.reduce((a, b) => a + b, 0)).toBe(100_000);
    expect(chi2(counts, new Array(10).fill(10_000))).toBeLessThan(CHI2_9_999);
  });

  test('above 2^21 cells the masked draws are uniform too: ten equal blocks of 2^21 + 5 cells', () => {
    const cells = 2 ** 21 + 5;
    const counts = new Int32Array(cells);
    new ResampleStream(6).uniformCounts(cells, 200_000, counts);
    const blocks = new Array(10).fill(0);
    for (let k = 0; k < cells; k++) blocks[Math.floor((k * 10) / cells)] += counts[k];
    expect(blocks.reduce((a, b) => a + b, 0)).toBe(200_000);
    // Blocks differ in size by at most one cell in 209,715: expected counts 20,000 each to 1e-5.
    expect(chi2(blocks, new Array(10).fill(20_000))).toBeLessThan(CHI2_9_999);
  });

  test('alias draws follow the weights (chi-square test at 0.1 %)', () => {
    const w = Float64Array.of(1, 2, 3, 4, 5, 6, 7, 8, 9, 10);
    const counts = new Int32Array(10);
    new ResampleStream(7).aliasCounts(new AliasTable(w), 110_000, counts);
    expect(
      chi2(
        counts,
        Array.from(w, (v) => v * 2000),
      ),
    ).toBeLessThan(CHI2_9_999);
  });

  test('the same seed gives the same draws; another seed others', () => {
    const a = new Int32Array(50);
    const b = new Int32Array(50);
    const c = new Int32Array(50);
    new ResampleStream(9).uniformCounts(50, 500, a);
    new ResampleStream(9).uniformCounts(50, 500, b);
    new ResampleStream(10).uniformCounts(50, 500, c);
    expect(Array.from(a)).toEqual(Array.from(b));
    expect(Array.from(a)).not.toEqual(Array.from(c));
  });
});

describe('knotUnits(sx, xs): which stretch between source values each value falls in', () => {
  test('finds the largest source value at or below each value, -1 below them all', () => {
    // Source: worked by hand (sx = 1, 2, 4: 0 is below all, 2 and 3 follow 2 at index 1, 9 follows 4 at index 2).
    expect(Array.from(knotUnits(Float64Array.of(1, 2, 4), Float64Array.of(0, 2, 3, 9)))).toEqual([-1, 1, 1, 2]);
  });
});
