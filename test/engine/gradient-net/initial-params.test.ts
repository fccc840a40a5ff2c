import { Float64Network } from '../../../src/engine/gradient-net/float64-network';
import { initialParams } from '../../../src/engine/gradient-net/initial-params';
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
});
