import type { NetworkParams } from '../../../src/engine/gradient-net/network-params';
import { Random } from '../../../src/engine/stats/random';

/** Random but fixed network parameters for tests (d columns, m units, L layers). */
export function randomParams(d: number, m: number, layers: number, seed: number): NetworkParams {
  const r = new Random(seed);
  const arr = (len: number, f: () => number) => Float64Array.from({ length: len }, f);
  return {
    d,
    hidden: m,
    layers,
    w: arr(m * d, () => r.normal()),
    b: arr(layers * m, () => r.normal()),
    c: arr(m, () => 0.2 + r.uniform()),
    v: arr(d * d, () => 0.5 * r.normal()),
    alpha: 0.3,
    beta: arr(d, () => r.normal()),
  };
}
