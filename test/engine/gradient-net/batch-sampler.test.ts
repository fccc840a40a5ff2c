import { BatchSampler, gatherRows } from '../../../src/engine/gradient-net/batch-sampler';
import { Random } from '../../../src/engine/stats/random';

describe('BatchSampler', () => {
  test('unweighted batches visit every row once per pass', () => {
    const s = new BatchSampler(10, 5, null, new Random(1));
    const seen = [...s.next(), ...s.next()].sort((a, b) => a - b);
    expect(seen).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  test('a batch of at least n unweighted rows is the whole sample in order', () => {
    const s = new BatchSampler(4, 10, null, new Random(1));
    expect(s.isFull).toBe(true);
    expect(Array.from(s.next())).toEqual([0, 1, 2, 3]);
  });

  test('weighted draws follow the weights and never pick zero-weight rows', () => {
    const w = Float64Array.of(0, 1, 3, 0);
    const s = new BatchSampler(4, 4000, w, new Random(2));
    const counts = [0, 0, 0, 0];
    for (const i of s.next()) counts[i]++;
    expect(counts[0]).toBe(0);
    expect(counts[3]).toBe(0);
    expect(counts[2] / 4000).toBeCloseTo(0.75, 1); // Source: 3 / (1 + 3), binomial sd 0.007
  });

  test('the same seed gives the same batches', () => {
    const a = new BatchSampler(50, 7, null, new Random(3));
    const b = new BatchSampler(50, 7, null, new Random(3));
    for (let k = 0; k < 10; k++) expect(Array.from(a.next())).toEqual(Array.from(b.next()));
  });

  test('gatherRows copies the chosen rows', () => {
    expect(Array.from(gatherRows(Float64Array.of(1, 2, 3, 4, 5, 6), 2, Uint32Array.of(2, 0)))).toEqual([5, 6, 1, 2]);
  });
});
