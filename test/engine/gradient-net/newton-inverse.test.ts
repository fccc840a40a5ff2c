import { Float64Network } from '../../../src/engine/gradient-net/float64-network';
import { newtonInverse } from '../../../src/engine/gradient-net/newton-inverse';
import { Random } from '../../../src/engine/stats/random';
import { randomParams } from './helpers';

describe('newtonInverse solves F(x) = y', () => {
  for (const layers of [1, 3]) {
    test(`F^-1(F(x)) = x for random x (layers = ${layers}), also far from the data`, () => {
      const d = 4;
      const p = { ...randomParams(d, 32, layers, 20 + layers), alpha: 0.01 };
      const net = new Float64Network(p);
      const rng = new Random(8);
      const y = new Float64Array(d);
      const x = new Float64Array(d);
      for (let rep = 0; rep < 50; rep++) {
        const scale = rep < 40 ? 1 : 50;
        const x0 = Float64Array.from({ length: d }, () => scale * rng.normal());
        net.forward(x0, y);
        const r = newtonInverse(net, y, x);
        expect(r.converged).toBe(true);
        for (let k = 0; k < d; k++) expect(Math.abs(x[k] - x0[k])).toBeLessThan(1e-8 * (1 + Math.abs(x0[k]))); // Source: common practice
      }
    });
  }
});
