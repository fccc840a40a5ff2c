import { compareFit, COMPARISON_MAX_ROWS, COMPARISON_SEED } from '../../src/engine/assess';
import { energyDistance } from '../../src/engine/stats/energy-distance';
import { ksStatistic } from '../../src/engine/stats/ks';
import { columnOf, points } from '../../src/engine/points';

describe('compareFit(source, ws, mapped, target, wt) records energy before/after and the largest KS after', () => {
  const source = points([[0, 0], [1, 0], [0, 1], [1, 1]]);
  const target = points([[3, 3], [5, 3], [3, 6], [5, 6]]);

  test('a mapped sample equal to the target has energyAfter 0 and ksMaxAfter 0', () => {
    const c = compareFit(source, null, target, target, null);
    expect(c.energyAfter).toBe(0);
    expect(c.ksMaxAfter).toBe(0);
    // Source: energyDistance and ksStatistic with the documented options
    expect(c.energyBefore).toBe(energyDistance(source, target, null, null, { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED }).value);
  });

  test('ksMaxAfter is the largest per-column KS statistic, with weights', () => {
    const mapped = points([[3, 3], [5, 3], [3, 6], [6, 6]]);
    const w = Float64Array.from([1, 2, 1, 1]);
    const c = compareFit(source, w, mapped, target, null);
    const ks = Math.max(ksStatistic(columnOf(mapped, 0), columnOf(target, 0), w), ksStatistic(columnOf(mapped, 1), columnOf(target, 1), w));
    expect(c.ksMaxAfter).toBe(ks);
    expect(c.ksMaxAfter).toBeGreaterThan(0);
  });
});
