import { OneWayMap } from '../../../src/engine/quantile/one-way-map';

function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const run = (m: OneWayMap, xs: number[], tails: 'clamp' | 'linear' = 'clamp') => {
  const out = new Float64Array(xs.length);
  const outside = m.evaluate(Float64Array.from(xs), out, tails, null);
  return { out: Array.from(out), outside };
};

describe('quantile/one-way-map', () => {
  const lin = new OneWayMap(Float64Array.of(0, 1, 3), Float64Array.of(0, 10, 20), 'linear', 0, 3);

  test('linear: interpolates between knots and hits knots exactly', () => {
    expect(run(lin, [0, 0.5, 1, 2, 3]).out).toEqual([0, 5, 10, 15, 20]);
  });

  test('clamp holds the end value outside and counts the rows', () => {
    expect(run(lin, [-1, 4, 1])).toEqual({ out: [0, 20, 10], outside: 2 });
  });

  test('linear tails continue the end segment slopes', () => {
    // Source: by hand, first slope 10, last slope 5
    expect(run(lin, [-1, 4], 'linear').out).toEqual([-10, 25]);
  });

  test('inside the data range but beyond the knots the map holds its end value', () => {
    const m = new OneWayMap(Float64Array.of(1, 2), Float64Array.of(5, 6), 'linear', 0, 3);
    expect(run(m, [0, 0.5, 2.5, 3], 'linear')).toEqual({ out: [5, 5, 6, 6], outside: 0 });
  });

  test('step: holds the value of the largest key at or below x', () => {
    const m = new OneWayMap(Float64Array.of(1, 2, 4), Float64Array.of(10, 10, 30), 'step', 1, 4);
    expect(run(m, [1, 1.9, 2, 3.99, 4]).out).toEqual([10, 10, 10, 10, 30]);
    expect(m.minSlope()).toBe(0);
  });

  test('equal keys are a jump: the later knot wins at the key', () => {
    const m = new OneWayMap(Float64Array.of(0, 1, 1, 2), Float64Array.of(0, 1, 3, 4), 'linear', 0, 2);
    expect(run(m, [0.5, 1, 1.5]).out).toEqual([0.5, 3, 3.5]);
  });

  test('NaN in gives NaN out, not counted outside', () => {
    expect(run(lin, [NaN, 1])).toEqual({ out: [NaN, 10], outside: 0 });
  });

  test('binary search, bucket index and merge walk give bit-identical results', () => {
    const r = rng(9);
    const K = 5000;
    const keys = new Float64Array(K);
    const vals = new Float64Array(K);
    let x = 0;
    let y = 0;
    for (let k = 0; k < K; k++) {
      x += r() ** 3 + (k % 100 === 0 ? 50 : 0);
      y += r() + 1e-3;
      keys[k] = x;
      vals[k] = y;
    }
    const m = new OneWayMap(keys, vals, 'linear', keys[0] - 1, keys[K - 1] + 1);
    const q = new Float64Array(4000);
    for (let i = 0; i < q.length; i++) q[i] = (r() * 1.1 - 0.05) * x;
    const big = new Float64Array(q.length);
    m.evaluate(q, big, 'linear', null); // bucket index (many rows)
    const sorted = q.slice().sort();
    const walked = new Float64Array(q.length);
    m.evaluate(sorted, walked, 'linear', null); // merge walk
    const pos = new Map<number, number>();
    sorted.forEach((v, i) => pos.set(v, walked[i]));
    for (let i = 0; i < q.length; i += 97) {
      const one = new Float64Array(1);
      m.evaluate(q.subarray(i, i + 1), one, 'linear', null); // binary search
      expect(big[i]).toBe(one[0]);
      expect(pos.get(q[i])).toBe(one[0]);
    }
  });

  test('minSlope is the smallest segment slope', () => {
    expect(lin.minSlope()).toBe(5);
  });

  test('evaluateAscending puts each result in its row, with the bits, outside count and flags of evaluate', () => {
    const r = rng(12);
    for (const kind of ['linear', 'step'] as const) {
      const K = 300;
      const keys = new Float64Array(K);
      const vals = new Float64Array(K);
      for (let k = 0; k < K; k++) {
        keys[k] = (k === 0 ? 0 : keys[k - 1]) + (kind === 'step' ? 0.1 : 0) + r() ** 2;
        vals[k] = (k === 0 ? 0 : vals[k - 1]) + r();
      }
      const m = new OneWayMap(keys, vals, kind, keys[0] - 1, keys[K - 1] + 1);
      const rows = Float64Array.from({ length: 3000 }, () => (r() * 1.2 - 0.1) * keys[K - 1]);
      rows[7] = NaN;
      const expected = new Float64Array(rows.length);
      const flagsA = new Uint8Array(rows.length);
      const outA = m.evaluate(rows, expected, 'linear', flagsA);
      const order = Uint32Array.from(rows.keys()).sort((a, b) => (rows[a] !== rows[a] ? 1 : rows[b] !== rows[b] ? -1 : rows[a] - rows[b]));
      const ascending = Float64Array.from(order, (i) => rows[i]);
      const got = new Float64Array(rows.length);
      const flagsB = new Uint8Array(rows.length);
      const outB = m.evaluateAscending(ascending, got, 'linear', flagsB, order);
      expect(outB).toBe(outA);
      expect(outA).toBeGreaterThan(0);
      expect(Array.from(flagsB)).toEqual(Array.from(flagsA));
      expect(Array.from(got)).toEqual(Array.from(expected));
      const plain = new Float64Array(rows.length);
      m.evaluateAscending(ascending, plain, 'linear', null, null);
      expect(Array.from(plain)).toEqual(Array.from(order, (i) => expected[i]));
    }
  });
});
