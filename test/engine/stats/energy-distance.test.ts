import { column, type Points } from '../../../src/engine/points';
import { energyDistance } from '../../../src/engine/stats/energy-distance';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

function randomPoints(n: number, d: number, seed: number, shift = 0): Points {
  const u = rng(seed);
  return { n, d, data: Float64Array.from({ length: n * d }, () => shift + u() + u() * u()) };
}

/** 2 E|X - Y| - E|X - X'| - E|Y - Y'| with weights, by a plain double loop. */
function bruteEnergy(a: Points, b: Points, wa?: ArrayLike<number>, wb?: ArrayLike<number>): number {
  const ua = wa ?? Array.from({ length: a.n }, () => 1);
  const ub = wb ?? Array.from({ length: b.n }, () => 1);
  const ta = Array.from(ua).reduce((x, y) => x + y, 0);
  const tb = Array.from(ub).reduce((x, y) => x + y, 0);
  const dist = (p: Points, i: number, q: Points, j: number): number => {
    let s = 0;
    for (let k = 0; k < p.d; k++) s += (p.data[i * p.d + k] - q.data[j * q.d + k]) ** 2;
    return Math.sqrt(s);
  };
  let xy = 0;
  let xx = 0;
  let yy = 0;
  for (let i = 0; i < a.n; i++) for (let j = 0; j < b.n; j++) xy += ((ua[i] * ub[j]) / (ta * tb)) * dist(a, i, b, j);
  for (let i = 0; i < a.n; i++) for (let j = 0; j < a.n; j++) xx += ((ua[i] * ua[j]) / (ta * ta)) * dist(a, i, a, j);
  for (let i = 0; i < b.n; i++) for (let j = 0; j < b.n; j++) yy += ((ub[i] * ub[j]) / (tb * tb)) * dist(b, i, b, j);
  return 2 * xy - xx - yy;
}

describe("energyDistance(a, b, wa, wb) is the weighted V-statistic 2E|X-Y| - E|X-X'| - E|Y-Y'|", () => {
  test('point masses at 0 and 1 are at energy distance 2', () => {
    // Source: definition (2 * 1 - 0 - 0)
    expect(energyDistance(column([0]), column([1]))).toEqual({ value: 2, subsampled: false, rows: { a: 1, b: 1 } });
  });

  test('d = 1: the sorted exact formula equals the brute-force double loop, weighted and not', () => {
    const a = randomPoints(83, 1, 1);
    const b = randomPoints(61, 1, 2, 0.3);
    const u = rng(3);
    const wa = Array.from({ length: 83 }, () => u());
    const wb = Array.from({ length: 61 }, () => (u() < 0.1 ? 0 : u()));
    // Source: brute-force double loop of the definition
    expect(energyDistance(a, b).value).toBeCloseTo(bruteEnergy(a, b), 12);
    expect(energyDistance(a, b, wa, wb).value).toBeCloseTo(bruteEnergy(a, b, wa, wb), 12);
  });

  test('d = 1 with ties across the samples equals the brute-force double loop', () => {
    const a = column([1, 1, 2, 3, 3, 3]);
    const b = column([1, 2, 2, 4]);
    expect(energyDistance(a, b).value).toBeCloseTo(bruteEnergy(a, b), 14);
  });

  test.each([2, 3, 7])('d = %i below maxRows equals the brute-force double loop and is not subsampled', (d) => {
    const a = randomPoints(50, d, 10 + d);
    const b = randomPoints(37, d, 20 + d, 0.2);
    const u = rng(d);
    const wa = Array.from({ length: 50 }, () => u());
    const wb = Array.from({ length: 37 }, () => u());
    const r = energyDistance(a, b, wa, wb);
    // Source: brute-force double loop of the definition
    expect(r.value).toBeCloseTo(bruteEnergy(a, b, wa, wb), 12);
    expect(r.subsampled).toBe(false);
  });

  test('identical samples are at distance 0; rows of weight zero do not count', () => {
    const a = randomPoints(30, 3, 5);
    expect(energyDistance(a, a).value).toBeCloseTo(0, 14);
    const extra: Points = { n: 31, d: 3, data: Float64Array.from([...a.data, 100, 100, 100]) };
    const w = [...Array.from({ length: 30 }, () => 1), 0];
    expect(energyDistance(extra, a, w).value).toBeCloseTo(0, 14);
    expect(energyDistance(column([1, 2, 50]), column([1, 2]), [1, 1, 0]).value).toBe(0);
  });

  test('above maxRows a seeded subsample is used: flagged, repeatable, and seed-dependent', () => {
    const a = randomPoints(300, 2, 1);
    const b = randomPoints(250, 2, 2, 0.5);
    const r1 = energyDistance(a, b, null, null, { maxRows: 100, seed: 7 });
    const r2 = energyDistance(a, b, null, null, { maxRows: 100, seed: 7 });
    const r3 = energyDistance(a, b, null, null, { maxRows: 100, seed: 8 });
    expect(r1).toEqual(r2);
    expect(r1.subsampled).toBe(true);
    expect(r1.rows).toEqual({ a: 100, b: 100 });
    expect(r3.value).not.toBe(r1.value);
    // The estimate is near the full value (a loose check; the subsample has 100 rows per side).
    const full = energyDistance(a, b, null, null, { maxRows: 300 }).value;
    expect(Math.abs(r1.value - full)).toBeLessThan(0.5 * full);
  });

  test('d = 1 is always exact, never subsampled', () => {
    const a = randomPoints(3000, 1, 1);
    const b = randomPoints(2500, 1, 2, 0.1);
    const r = energyDistance(a, b, null, null, { maxRows: 10 });
    expect(r.subsampled).toBe(false);
    expect(r.rows).toEqual({ a: 3000, b: 2500 });
  });

  test('inputs are not mutated', () => {
    const a = randomPoints(20, 2, 1);
    const copy = Float64Array.from(a.data);
    const w = Object.freeze(Array.from({ length: 20 }, (_, i) => i));
    energyDistance(Object.freeze(a), a, w, null, { maxRows: 5 });
    expect(a.data).toEqual(copy);
  });

  test('bad input throws RemapError naming the argument', () => {
    const a = randomPoints(5, 2, 1);
    expect(() => energyDistance(a, randomPoints(5, 3, 1))).toThrow(/a has 2 columns and b has 3/);
    expect(() => energyDistance(a, { n: 0, d: 2, data: new Float64Array(0) })).toThrow(/b has 0 rows/);
    expect(() => energyDistance(a, a, null, null, { maxRows: 1 })).toThrow(/maxRows is 1/);
    expect(() => energyDistance(a, a, null, null, { seed: -1 })).toThrow(/seed is -1/);
    expect(() => energyDistance(a, a, [0, 0, 0, 0, 0])).toThrow(/all weights of a are zero/);
    expect(() => energyDistance(a, { n: 1, d: 2, data: Float64Array.from([1, Infinity]) })).toThrow(/b holds Infinity in row 1, column 2/);
  });
});
