import { prepareFit } from '../../src/engine/methods';
import { column, sample } from '../../src/engine/points';
import { ordinalMethod } from '../../src/engine/quantile/ordinal-method';
import type { TransportMap } from '../../src/engine/map';

describe('reference: equipercentile equating (ordinal method)', () => {
  test('X = {0,0,1,1,1,2,2,3,3,4}, Y = {0,1,1,2,2,3,3,3,4,4}: scores 0..4 equate to 0.5, 1.75, 2.8333, 3.5, 4.25', () => {
    const s = sample(Object.freeze([0, 0, 1, 1, 1, 2, 2, 3, 3, 4]));
    const t = sample(Object.freeze([0, 1, 1, 2, 2, 3, 3, 3, 4, 4]));
    const m = ordinalMethod.fit(s, t, prepareFit(ordinalMethod, s, t, {}), {}) as TransportMap;
    const e = Array.from(m.apply(column([0, 1, 2, 3, 4])).data);
    // Source: Kolen & Brennan, Test Equating, Scaling, and Linking, ch. 2, percentile-rank formulas
    // P(x) = 100[F(x-1) + 0.5 f(x)] and e(x) = (P/100 - G(yU - 1))/g(yU) + yU - 0.5, computed by hand
    // (the book's worked table recalled from memory agrees)
    const expected = [0.5, 1.75, 2 + 0.5 + 1 / 3, 3.5, 4.25];
    e.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
  });

  test('the percentile rank of a score is the middle of its cumulative block', () => {
    // Mapping onto the scores 0..99 (one row each), whose continuised CDF inverse is 100 p - 0.5, reads off P(x) - 0.5
    const s = sample([0, 0, 1, 1, 1, 2, 2, 3, 3, 4]);
    const t = sample(Array.from({ length: 100 }, (_, i) => i));
    const m = ordinalMethod.fit(s, t, prepareFit(ordinalMethod, s, t, {}), {}) as TransportMap;
    // Source: Kolen & Brennan ch. 2, P(x) = 10, 35, 60, 80, 95 for scores 0..4; G*^-1(P/100) = P - 0.5 for 0..99
    const e = Array.from(m.apply(column([0, 1, 2, 3, 4])).data);
    [9.5, 34.5, 59.5, 79.5, 94.5].forEach((v, i) => expect(e[i]).toBeCloseTo(v, 12));
  });
});
