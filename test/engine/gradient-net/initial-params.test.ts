import { Float64Network } from '../../../src/engine/gradient-net/float64-network';
import { initialParams, linearOnly } from '../../../src/engine/gradient-net/initial-params';
import { Random } from '../../../src/engine/stats/random';

describe('initialParams (Gaussian warm start)', () => {
  test('the linear part V^T V + alpha I equals the given map and alpha is half its smallest eigenvalue', () => {
    const a = Float64Array.of(2, 0.5, 0.5, 1);
    const p = initialParams(2, 8, 1, a, new Random(1));
    const lin = new Float64Network(p).linear;
    for (let i = 0; i < 4; i++) expect(lin[i]).toBeCloseTo(a[i], 12);
    expect(p.alpha).toBeCloseTo((3 - Math.sqrt(2)) / 4, 12); // Source: eigenvalues of [[2, .5], [.5, 1]] are (3 -+ sqrt 2) / 2
    expect(Array.from(p.beta)).toEqual([0, 0]);
  });

  test('the same generator state gives the same weights', () => {
    const a = Float64Array.of(1, 0, 0, 1);
    expect(Array.from(initialParams(2, 8, 2, a, new Random(5)).w)).toEqual(Array.from(initialParams(2, 8, 2, a, new Random(5)).w));
  });

  test('linearOnly zeroes the output gains, leaving F(x) = (V^T V + alpha I) x + beta exactly', () => {
    const a = Float64Array.of(2, 0.5, 0.5, 1);
    const p = initialParams(2, 8, 1, a, new Random(1));
    const lin = linearOnly(p);
    expect(Array.from(p.c).every((c) => c > 0)).toBe(true);
    expect(Array.from(lin.c)).toEqual(new Array(8).fill(0));
    const out = new Float64Array(2);
    const net = new Float64Network(lin);
    net.forward(Float64Array.of(1.5, -2), out);
    expect(out[0]).toBeCloseTo(2 * 1.5 + 0.5 * -2, 12); // Source: A x with A = [[2, .5], [.5, 1]]
    expect(out[1]).toBeCloseTo(0.5 * 1.5 + 1 * -2, 12);
  });
});
