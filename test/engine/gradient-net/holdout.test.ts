import { holdoutSplit, pickRows } from '../../../src/engine/gradient-net/holdout';
import { Random } from '../../../src/engine/stats/random';

describe('holdoutSplit', () => {
  test('holds out floor(n / 5) rows, at most 1,000, disjoint from the training rows and covering all rows', () => {
    const s = holdoutSplit(500, null, new Random(1));
    expect(s.held.length).toBe(100); // Source: the 20 % rule, 500 / 5
    const all = [...s.train, ...s.held].sort((a, b) => a - b);
    expect(all).toEqual(Array.from({ length: 500 }, (_, i) => i));
    expect(holdoutSplit(20000, null, new Random(1)).held.length).toBe(1000);
  });

  test('holds nothing out of a small sample or when one part would carry no weight', () => {
    expect(holdoutSplit(60, null, new Random(1)).held.length).toBe(0); // Source: 60 / 5 = 12 < 20
    const w = new Float64Array(200);
    w[0] = 1; // a single weighted row cannot be both trained on and held out
    const s = holdoutSplit(200, w, new Random(2));
    expect(s.held.length).toBe(0);
    expect(s.train.length).toBe(200);
  });

  test('the same seed gives the same split', () => {
    expect(Array.from(holdoutSplit(300, null, new Random(5)).held)).toEqual(Array.from(holdoutSplit(300, null, new Random(5)).held));
  });

  test('pickRows copies the chosen rows and weights', () => {
    const r = pickRows(Float64Array.of(1, 2, 3, 4, 5, 6), Float64Array.of(0.1, 0.2, 0.3), 2, Uint32Array.of(2, 0));
    expect(Array.from(r.data)).toEqual([5, 6, 1, 2]);
    expect(Array.from(r.weights!)).toEqual([0.3, 0.1]);
  });
});
