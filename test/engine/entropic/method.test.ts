import { entropicMethod } from '../../../src/engine/entropic/method';
import { fitMap, restoreMap } from '../../../src/engine/methods';
import { sample } from '../../../src/engine/points';

describe('entropicMethod', () => {
  test('is a joint, weighted method needing 2 rows, with smoothing, max_iterations, tolerance, seed and units settings', () => {
    expect(entropicMethod.name).toBe('entropic');
    expect(entropicMethod.shape).toBe('joint');
    expect(entropicMethod.weights).toBe(true);
    expect(entropicMethod.minRows(5)).toBe(2);
    expect(entropicMethod.settings.map((s) => s.name)).toEqual(['smoothing', 'max_iterations', 'tolerance', 'seed', 'units']);
  });

  test('fits through fitMap with text settings and restores through restoreMap', async () => {
    const src = sample([[0, 0], [1, 0], [0, 1], [1, 1]]);
    const tgt = sample([[5, 5], [7, 5], [5, 7], [7, 7]], [1, 2, 1, 2]);
    const map = await fitMap('entropic', src, tgt, { SMOOTHING: '0.5', tolerance: '1e-9' });
    expect(map.diagnostics().settings.smoothing).toBe(0.5);
    const back = restoreMap(JSON.parse(JSON.stringify(map.toJSON())));
    expect(Array.from(back.apply(src).data)).toEqual(Array.from(map.apply(src).data));
  });
});
