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
    const src = sample([
      [0, 0],
      [1, 0],
      [0, 1],
      [1, 1],
    ]);
    const tgt = sample(
      [
        [5, 5],
        [7, 5],
        [5, 7],
        [7, 7],
      ],
      [1, 2, 1, 2],
    );
    const map = await fitMap('entropic', src, tgt, { SMOOTHING: '0.5', tolerance: '1e-9' });
    expect(map.diagnostics().settings.smoothing).toBe(0.5);
    const back = restoreMap(JSON.parse(JSON.stringify(map.toJSON())));
    expect(Array.from(back.apply(src).data)).toEqual(Array.from(map.apply(src).data));
  });
});

describe('entropic cost: its units are stated', () => {
  test('the cost says standardised units by default and raw units with units=raw', async () => {
    const src = sample([
      [0, 0],
      [1, 100],
      [0, 200],
      [1, 300],
      [0.5, 150],
    ]);
    const tgt = sample([
      [5, 5],
      [7, 105],
      [5, 207],
      [7, 307],
      [6, 160],
    ]);
    // Source: design choice (a cost in standardised units must say so beside a raw-units figure).
    expect((await fitMap('entropic', src, tgt, {})).cost().units).toBe('standardised');
    expect((await fitMap('entropic', src, tgt, { units: 'raw' })).cost().units).toBe('raw');
  });
});
