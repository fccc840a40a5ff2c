import { makePrng } from '../../../src/engine/gradient-net/prng';

describe('makePrng(seed)', () => {
  test('the same seed gives the same stream; another seed another stream', () => {
    const a = makePrng(7);
    const b = makePrng(7);
    const c = makePrng(8);
    const sa = Array.from({ length: 20 }, () => a.next());
    expect(Array.from({ length: 20 }, () => b.next())).toEqual(sa);
    expect(Array.from({ length: 20 }, () => c.next())).not.toEqual(sa);
  });

  test('uniforms lie in [0, 1) with mean near 1/2; normals have mean near 0 and variance near 1', () => {
    const r = makePrng(1);
    let s = 0;
    let lo = 1;
    let hi = 0;
    for (let i = 0; i < 20000; i++) {
      const u = r.next();
      s += u;
      lo = Math.min(lo, u);
      hi = Math.max(hi, u);
    }
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
    expect(s / 20000).toBeCloseTo(0.5, 2); // Source: U(0,1) mean, sd of the mean 0.002
    let m = 0;
    let v = 0;
    for (let i = 0; i < 20000; i++) {
      const z = r.normal();
      m += z;
      v += z * z;
    }
    expect(Math.abs(m / 20000)).toBeLessThan(0.03); // Source: N(0,1), sd of the mean 0.007
    expect(Math.abs(v / 20000 - 1)).toBeLessThan(0.05);
    for (let i = 0; i < 1000; i++) expect(r.below(3)).toBeLessThan(3);
  });
});
