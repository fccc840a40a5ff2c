import { chooseMethod, ENTROPIC_MAX_PAIRS } from '../../src/engine/auto';

const pts = (n: number, d: number) => ({ n, d, data: new Float64Array(n * d) });

describe('chooseMethod: what auto picks, and why', () => {
  test('one column always gets quantile, the exact optimal map in 1-D', () => {
    // Source: fact of the trade (in 1-D the monotone rearrangement is optimal)
    expect(chooseMethod(pts(50, 1), pts(60, 1), {}, true).method).toBe('quantile');
    expect(chooseMethod(pts(50, 1), pts(60, 1), {}, false).method).toBe('quantile');
  });

  test('several columns without a method get linear, and the reason names the alternatives', () => {
    const c = chooseMethod(pts(500, 3), pts(500, 3), {}, false);
    expect(c.method).toBe('linear');
    expect(c.reason).toMatch(/entropic or gradient-net/);
  });

  test('auto: fewer than 10 rows per column falls back to linear (common practice)', () => {
    const c = chooseMethod(pts(25, 3), pts(400, 3), {}, true);
    expect(c.method).toBe('linear');
    expect(c.reason).toMatch(/Only 25 rows for 3 columns/);
  });

  test('auto: moderate sizes get entropic; beyond 5,000 x 5,000 pairs gradient-net, unless the time budget is short', () => {
    expect(chooseMethod(pts(4000, 8), pts(4000, 8), {}, true).method).toBe('entropic');
    expect(5000 * 5000).toBe(ENTROPIC_MAX_PAIRS);
    expect(chooseMethod(pts(20000, 3), pts(20000, 3), {}, true).method).toBe('gradient-net');
    expect(chooseMethod(pts(20000, 3), pts(20000, 3), { time_budget: 5 }, true).method).toBe('linear');
    // Source: design choice (setting names are case-insensitive and take - or _ everywhere, auto included).
    expect(chooseMethod(pts(20000, 3), pts(20000, 3), { Time_Budget: '5' }, true).method).toBe('linear');
    expect(chooseMethod(pts(2000, 30), pts(2000, 30), {}, true).method).toBe('gradient-net');
  });
});
