import { epsSchedule, halfSquaredDiameter, meanCost } from '../../../src/engine/entropic/eps-schedule';
import { points } from '../../../src/engine/points';

describe('eps-schedule', () => {
  test('epsSchedule halves from the first power-of-two multiple of the target at or above start down to the target', () => {
    // Source: Schmitzer 2019, section 3.2 (geometric eps-scaling); factor 2 by design.
    expect(epsSchedule(0.25, 1)).toEqual([1, 0.5, 0.25]);
    expect(epsSchedule(0.25, 0.9)).toEqual([1, 0.5, 0.25]);
    expect(epsSchedule(1, 0.5)).toEqual([1]);
  });

  test('epsSchedule stops after maxStages halvings', () => {
    // Source: common practice (bounded loops).
    expect(epsSchedule(1, 1e9, 3)).toEqual([8, 4, 2, 1]);
  });

  test('halfSquaredDiameter is half the squared diagonal of the box holding both sets', () => {
    // Source: common practice, box [0,3] x [0,4]: (9 + 16) / 2.
    expect(halfSquaredDiameter(points([[0, 0]]), points([[3, 4]]))).toBe(12.5);
    expect(halfSquaredDiameter(points([[1, 1]]), points([[1, 1]]))).toBe(0);
  });

  test('meanCost is E|X - Y|^2 / 2 for independent draws: (Var X + Var Y + |mean X - mean Y|^2) / 2, with the masses', () => {
    const x = points([
      [0, 0],
      [2, 0],
    ]);
    const y = points([
      [5, 1],
      [5, 3],
      [5, 5],
    ]);
    const logA = Float64Array.of(Math.log(0.25), Math.log(0.75));
    const logB = new Float64Array(3).fill(-Math.log(3));
    let want = 0;
    for (let i = 0; i < 2; i++) {
      for (let j = 0; j < 3; j++) {
        const c = ((x.data[2 * i] - y.data[2 * j]) ** 2 + (x.data[2 * i + 1] - y.data[2 * j + 1]) ** 2) / 2;
        want += Math.exp(logA[i] + logB[j]) * c;
      }
    }
    // Source: common practice, the mean cost over all pairs under the product of the masses.
    expect(meanCost(x, logA, y, logB)).toBeCloseTo(want, 12);
  });
});
