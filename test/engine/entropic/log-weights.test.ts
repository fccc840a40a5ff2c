import { supportOf } from '../../../src/engine/entropic/log-weights';
import { sample } from '../../../src/engine/points';

describe('log-weights', () => {
  test('supportOf drops zero-weight rows and normalises the rest to log-probabilities', () => {
    const s = sample([[1], [2], [3]], [1, 0, 3]);
    const r = supportOf(s);
    expect(Array.from(r.points.data)).toEqual([1, 3]);
    // Source: common practice, 1/4 and 3/4.
    expect(r.logMass[0]).toBeCloseTo(Math.log(0.25), 15);
    expect(r.logMass[1]).toBeCloseTo(Math.log(0.75), 15);
  });

  test('supportOf gives equal masses 1/n without weights and copies the data', () => {
    const s = sample([
      [1, 2],
      [3, 4],
    ]);
    const r = supportOf(s);
    // Source: common practice, log(1/2).
    expect(Array.from(r.logMass)).toEqual([-Math.log(2), -Math.log(2)]);
    expect(r.points.data).not.toBe(s.data);
    expect(Array.from(r.points.data)).toEqual([1, 2, 3, 4]);
  });
});
