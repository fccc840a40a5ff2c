import type { NetworkParams } from '../../../src/engine/gradient-net/network-params';
import { makePrng } from '../../../src/engine/gradient-net/prng';

/** Random but fixed network parameters for tests (d columns, m units, L layers). */
export function randomParams(d: number, m: number, layers: number, seed: number): NetworkParams {
  const r = makePrng(seed);
  const arr = (len: number, f: () => number) => Float64Array.from({ length: len }, f);
  return {
    d,
    hidden: m,
    layers,
    w: arr(m * d, () => r.normal()),
    b: arr(layers * m, () => r.normal()),
    c: arr(m, () => 0.2 + r.next()),
    v: arr(d * d, () => 0.5 * r.normal()),
    alpha: 0.3,
    beta: arr(d, () => r.normal()),
  };
}
