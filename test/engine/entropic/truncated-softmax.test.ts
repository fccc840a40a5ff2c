import { barycentricMap } from '../../../src/engine/entropic/barycentric-map';
import { TRUNCATION_DIGITS, TruncatedSoftmax, expTable, tableExpWeights } from '../../../src/engine/entropic/truncated-softmax';
import type { Points } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';

type Kernel = 'auto' | 'typescript';
/** Both implementations of the passes: 'auto' is the WebAssembly SIMD one here (Node 20), 'typescript' the plain loops. */
const KERNELS: Kernel[] = ['auto', 'typescript'];

function cloud(n: number, d: number, seed: number, spread: number): Points {
  const r = new Random(seed);
  return { n, d, data: Float64Array.from({ length: n * d }, () => spread * r.normal()) };
}

/** Log-normal coordinates, centred on their mean: strongly right-skewed. */
function skewed(n: number, d: number, seed: number): Points {
  const r = new Random(seed);
  const data = Float64Array.from({ length: n * d }, () => Math.exp(0.9 * r.normal()));
  const mean = Math.exp(0.405);
  return { n, d, data: data.map((v) => v - mean) };
}

/** Three tight, well-separated clusters of unequal sizes. */
function clustered(n: number, d: number, seed: number): Points {
  const r = new Random(seed);
  const centres = [0, 1, 2].map(() => Array.from({ length: d }, () => 3 * r.normal()));
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    const c = centres[i % 7 < 4 ? 0 : i % 7 < 6 ? 1 : 2];
    for (let k = 0; k < d; k++) data[i * d + k] = c[k] + 0.3 * r.normal();
  }
  return { n, d, data };
}

function diameterOf(p: Points): number {
  let best = 0;
  for (let i = 0; i < p.n; i++) {
    for (let j = 0; j < i; j++) {
      let s = 0;
      for (let k = 0; k < p.d; k++) s += (p.data[i * p.d + k] - p.data[j * p.d + k]) ** 2;
      if (s > best) best = s;
    }
  }
  return Math.sqrt(best);
}

/** Largest Euclidean distance between matching rows, over the diameter. */
function worstRelative(a: Float64Array, b: Float64Array, d: number, diameter: number): number {
  let worst = 0;
  for (let i = 0; i < a.length / d; i++) {
    let e = 0;
    for (let k = 0; k < d; k++) e += (a[i * d + k] - b[i * d + k]) ** 2;
    worst = Math.max(worst, Math.sqrt(e) / diameter);
  }
  return worst;
}

/** The kernel and the untruncated map on the same support, potential and rows; returns the worst distance / diameter. */
function compare(support: Points, x: Points, eps: number, seed: number, gSpread: number, kernel: Kernel = 'auto'): number {
  const m = support.n;
  const r = new Random(seed);
  const logMass = new Float64Array(m).fill(-Math.log(m));
  const g = Float64Array.from({ length: m }, () => gSpread * r.normal());
  const h = Float64Array.from(g, (v, j) => logMass[j] + v / eps);
  const exact = barycentricMap(x, support, logMass, g, eps);
  const softmax = new TruncatedSoftmax(support, h, eps, kernel);
  // Source: design choice (Node 20 has WebAssembly SIMD, so 'auto' must pick it; 'typescript' must be honoured).
  expect(softmax.kernel).toBe(kernel === 'auto' ? 'wasm' : 'typescript');
  const fast = softmax.map(x);
  return worstRelative(fast, exact, x.d, diameterOf(support));
}

/** exp(z) for each z by tableExpWeights (values -z, top 0, scale 1: z = (0 - (-z)) * 1 exactly). */
function tableExps(table: Float64Array, zs: number[]): Float64Array {
  const w = new Float64Array(zs.length);
  tableExpWeights(
    table,
    Float64Array.from(zs, (z) => -z),
    zs.length,
    0,
    1,
    w,
  );
  return w;
}

describe('tableExpWeights', () => {
  test('matches Math.exp to 2.2e-14 relative over its whole range, on a fine grid and around every table step', () => {
    // Source: the Taylor remainder of degree 5 on |r| < 1/64 is (1/64)^6 / 6! = 2.02e-14 relative (worked by hand),
    // plus a few roundings of 1.1e-16; Math.exp is within 1 ulp (V8 uses fdlibm's exp).
    const span = TRUNCATION_DIGITS + Math.log(5000);
    const table = expTable(span);
    const zs: number[] = [];
    const steps = 200_000;
    for (let i = 0; i <= steps; i++) zs.push(-(i / steps) * span);
    for (let k = 0; k < table.length - 1; k++) {
      for (const dz of [0, 1e-15, -1e-15, -0.5 / 64, -0.9999 / 64]) {
        const z = -k / 64 + dz;
        if (z <= 0 && z >= -span) zs.push(z);
      }
    }
    const w = tableExps(table, zs);
    const exp = Math.exp;
    let worst = 0;
    for (let i = 0; i < zs.length; i++) worst = Math.max(worst, Math.abs(w[i] / exp(zs[i]) - 1));
    expect(worst).toBeLessThanOrEqual(2.2e-14);
    // Source: design choice: a worst error far below the remainder would mean the grid missed the steps' ends.
    expect(worst).toBeGreaterThan(1e-15);
  });

  test('is exactly 1 at 0, 0 at and below the end of its table, at -Infinity and at NaN, and returns the sum', () => {
    const table = expTable(30);
    const end = -(table.length - 1) / 64;
    const w = tableExps(table, [0, end, end - 5, -1e300, -Infinity, NaN, -30]);
    // Source: exp(0) = 1 (the polynomial is 1 at r = 0 and the table's first entry is Math.exp(0) = 1).
    expect(w[0]).toBe(1);
    // Source: design choice (the last table entry is 0, so anything clamped to the end weighs nothing).
    expect(Array.from(w.subarray(1, 6))).toEqual([0, 0, 0, 0, 0]);
    // Source: the table covers its span: exp(-30) = 9.36e-14.
    expect(w[6] / Math.exp(-30)).toBeCloseTo(1, 13);
    // Source: the returned total is the sum of the weights (worked by hand: 1 + exp(-2) with top 1, values 1 and 3).
    const two = new Float64Array(2);
    expect(tableExpWeights(table, Float64Array.of(1, 3), 2, 1, 1, two)).toBeCloseTo(1 + Math.exp(-2), 14);
  });
});

describe.each(KERNELS)('TruncatedSoftmax, kernel %p', (kernel) => {
  test.each([
    [2, 0.01],
    [5, 0.05],
    [8, 0.03],
  ])('at d = %p, eps = %p it matches the untruncated entropic map within its stated bound, 1e-10 x the support diameter', (d, eps) => {
    // Source: the bound follows from the truncation rule (weights below e^-(23.1 + log m) of the largest left out) and
    // the rounding terms of the class comment; the untruncated map is barycentricMap (every weight above e^-60).
    const x = cloud(203, d, 3, 1.5); // 203: the last pass of two rows is partial
    expect(compare(cloud(700, d, 1, 1), x, eps, 2, 0.5, kernel)).toBeLessThanOrEqual(1e-10);
  });

  test.each([2, 3, 5, 8, 12])('on skewed and clustered supports at d = %p it matches the untruncated map within 1e-10 x diameter', (d) => {
    // Source: the class comment's bound; barycentricMap is the independent, untruncated evaluation. d = 3 pads a chunk
    // of 4 columns, d = 5 one of 8, d = 12 takes a chunk of 8 and one of 4.
    const eps = (d / 32) * Math.pow(700, -2 / (d + 4)); // about the default smoothing's size, in squared units
    const m = 700;
    const skew = skewed(m, d, 10 + d);
    expect(compare(skew, skewed(150, d, 20 + d), eps, 30 + d, 3 * eps, kernel)).toBeLessThanOrEqual(1e-10);
    const clusters = clustered(m, d, 40 + d);
    expect(compare(clusters, clustered(150, d, 50 + d), eps, 60 + d, 3 * eps, kernel)).toBeLessThanOrEqual(1e-10);
    // Rows between and beyond the clusters too (far tails of the softmax).
    expect(compare(clusters, cloud(80, d, 70 + d, 4), eps, 60 + d, 3 * eps, kernel)).toBeLessThanOrEqual(1e-10);
  });

  test('a support far from the origin at small eps still matches within the bound (rows taken by squared differences)', () => {
    // Source: the class comment: the product form's rounding gamma (|y|^2 + 2 |x| |y|) / (2 eps) would be about 1e-8
    // here, so the per-row check must switch to squared differences, whose rounding is gamma D_min / (2 eps).
    const d = 4;
    const base = cloud(400, d, 80, 1);
    const support = { n: base.n, d, data: base.data.map((v) => v + 100) };
    const near = cloud(60, d, 81, 1);
    const x = { n: near.n, d, data: near.data.map((v) => v + 100) };
    expect(compare(support, x, 0.002, 82, 0.01, kernel)).toBeLessThanOrEqual(1e-10);
  });

  test('a row gives the same bits alone, in a block of four and in a large call, at any position', () => {
    // Source: design choice (results must not depend on the batch a row arrives in, so rows can be split freely).
    for (const d of [3, 8, 12]) {
      const support = skewed(300, d, 90 + d);
      const r = new Random(91 + d);
      const h = Float64Array.from({ length: 300 }, () => 0.3 * r.normal());
      const softmax = new TruncatedSoftmax(support, h, 0.3, kernel); // broad weights: every bit of every logit counts
      const rows = cloud(101, d, 92 + d, 1.2);
      // Row 100 far away, so that it is taken by squared differences while its neighbours are not.
      for (let k = 0; k < d; k++) rows.data[100 * d + k] = 40 + k;
      const all = softmax.map(rows);
      const pick = (ids: number[]): Points => ({
        n: ids.length,
        d,
        data: Float64Array.from(ids.flatMap((i) => Array.from(rows.data.subarray(i * d, i * d + d)))),
      });
      for (const i of [0, 1, 7, 50, 99, 100]) {
        const want = Array.from(all.subarray(i * d, i * d + d));
        expect(Array.from(softmax.map(pick([i])))).toEqual(want);
        const block = softmax.map(pick([(i + 3) % 101, i, (i + 17) % 101, (i + 40) % 101]));
        expect(Array.from(block.subarray(d, 2 * d))).toEqual(want);
        const odd = softmax.map(pick([(i + 5) % 101, (i + 6) % 101, i]));
        expect(Array.from(odd.subarray(2 * d, 3 * d))).toEqual(want);
      }
    }
  });
});

describe('TruncatedSoftmax: the WebAssembly and TypeScript kernels', () => {
  test.each([2, 5, 8, 12])('agree within the stated bound on skewed and clustered data at d = %p (in fact to the bit)', (d) => {
    // Source: the class comment: both kernels are within 1e-10 x diameter of the untruncated map, so within 2e-10 of each
    // other; design choice: they run the same float64 operations in the same order, so they must give the same bits.
    const m = 600;
    const eps = (d / 32) * Math.pow(m, -2 / (d + 4));
    const r = new Random(200 + d);
    for (const [support, rows] of [
      [skewed(m, d, 210 + d), skewed(151, d, 220 + d)],
      [clustered(m, d, 230 + d), clustered(151, d, 240 + d)],
      [clustered(m, d, 230 + d), cloud(41, d, 250 + d, 4)],
    ]) {
      const h = Float64Array.from({ length: m }, () => (3 * r.normal()) / 2);
      const simd = new TruncatedSoftmax(support, h, eps);
      const plain = new TruncatedSoftmax(support, h, eps, 'typescript');
      expect([simd.kernel, plain.kernel]).toEqual(['wasm', 'typescript']);
      const a = simd.map(rows);
      const b = plain.map(rows);
      expect(worstRelative(a, b, d, diameterOf(support))).toBeLessThanOrEqual(2e-10);
      expect(Array.from(a)).toEqual(Array.from(b));
    }
  });
});
