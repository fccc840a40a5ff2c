import { fitMapSync, getMethod, outsideSummary, listMethods, settingSpecs } from '../../src/engine/methods';
import { column, sample } from '../../src/engine/points';
import { extrapolationWarning, outsideText } from '../../src/engine/outside';

describe('what happens outside the fitted range, per method', () => {
  test('only quantile, step and ordinal (and gradient-net, in its own folder) list the tails setting', () => {
    // Source: design choice (tails is listed where it changes the result)
    for (const m of ['quantile', 'step', 'ordinal']) expect(settingSpecs(getMethod(m)).map((s) => s.name)).toContain('tails');
    for (const m of ['linear', 'pairs', 'entropic']) expect(settingSpecs(getMethod(m)).map((s) => s.name)).not.toContain('tails');
  });

  test('every method has a text, and the texts say what the reviewer needs to know', () => {
    for (const m of listMethods()) expect(outsideSummary(m).length).toBeGreaterThan(40);
    // Source: fact of the method (an affine map is defined on all of R^d)
    expect(outsideSummary(getMethod('linear'))).toMatch(/same affine map continues/);
    // Source: fact of the method (the entropic map averages target rows: Pooladian & Niles-Weed 2021)
    expect(outsideSummary(getMethod('entropic'))).toMatch(/convex hull.*value at risk/);
    expect(outsideSummary(getMethod('pairs'))).toMatch(/no new points/);
    expect(outsideSummary(getMethod('quantile'))).toMatch(/tails=clamp \(default\).*clamped.*tails=linear.*linearly/);
    expect(outsideText('quantile', { tails: 'linear' })).toMatch(/continue linearly/);
    expect(outsideText('quantile', {})).toMatch(/clamped/);
  });

  test("the warning belongs to one call: it counts that call's rows and the map keeps nothing", () => {
    const map = fitMapSync('quantile', sample([0, 1, 2, 3]), sample([0, 10, 20, 30]));
    const first = map.apply(column([-5, 1, 2, 9]));
    const report = JSON.stringify(map.diagnostics());
    const w = extrapolationWarning(map, first);
    // Source: by hand, -5 and 9 lie outside [0, 3]
    expect(w?.message).toMatch(/^2 of 4 rows \(50\.0%\) lay outside the source range the quantile map was fitted on/);
    map.apply(column([100, 200]));
    expect(JSON.stringify(map.diagnostics())).toBe(report);
    const inv = extrapolationWarning(map, map.invert(column([-1, 5])), 'invert');
    expect(inv?.message).toMatch(/^1 of 2 rows .*outside the target range/);
  });
});
