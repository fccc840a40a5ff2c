import { epsSchedule, halfSquaredDiameter } from '../../../src/engine/entropic/eps-schedule';
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
});
