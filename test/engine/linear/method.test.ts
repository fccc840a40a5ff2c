import { linearMethod } from '../../../src/engine/linear/method';
import { fitMapSync, getMethod, restoreMap, settingSpecs } from '../../../src/engine/methods';
import { sample } from '../../../src/engine/points';

describe('linearMethod: the method entry of the linear map', () => {
  test('declares a joint, weighted method needing d + 2 rows, with a ridge setting', () => {
    expect(linearMethod.name).toBe('linear');
    expect(linearMethod.shape).toBe('joint');
    expect(linearMethod.weights).toBe(true);
    expect(linearMethod.minRows(1)).toBe(3);
    expect(linearMethod.minRows(10)).toBe(12);
    expect(settingSpecs(getMethod('linear')).map((s) => s.name)).toEqual(['ridge', 'units']);
    // Source: design choice (linear does not honour tails, so giving it is an error that lists what it takes)
    expect(() =>
      fitMapSync(
        'linear',
        sample([
          [1, 0],
          [2, 1],
          [3, 3],
          [4, 2],
        ]),
        sample([
          [1, 0],
          [2, 1],
          [3, 3],
          [4, 2],
        ]),
        { tails: 'linear' },
      ),
    ).toThrow(/Unknown setting "tails" for method linear/);
  });

  test('fits through fitMapSync with settings as text, and restores through restoreMap', () => {
    const src = sample(
      [
        [1, 0],
        [2, 1],
        [3, 3],
        [4, 2],
        [5, 5],
      ],
      [1, 1, 2, 1, 1],
    );
    const tgt = sample([
      [0, 1],
      [2, 2],
      [3, 5],
      [6, 3],
      [7, 8],
      [9, 9],
    ]);
    const map = fitMapSync('linear', src, tgt, { Ridge: '0' });
    expect(map.method).toBe('linear');
    expect(map.diagnostics().settings).toEqual({ ridge: 0, units: 'standardised' });
    const back = restoreMap(JSON.parse(JSON.stringify(map.toJSON())));
    const x = sample([[2.5, 2.5]]);
    expect(back.apply(x).data).toEqual(map.apply(x).data);
  });

  test('too few rows and a negative ridge are refused before fitting', () => {
    const three = sample([
      [1, 2],
      [2, 1],
      [3, 3],
    ]);
    expect(() => fitMapSync('linear', three, three)).toThrow(/at least 4 are needed/);
    const ok = sample([
      [1, 2],
      [2, 1],
      [3, 3],
      [0, 5],
    ]);
    expect(() => fitMapSync('linear', ok, ok, { ridge: -1 })).toThrow(/setting ridge of method linear must be at least 0/);
  });
});
