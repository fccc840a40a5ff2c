import { prepareFit } from '../../../src/engine/methods';
import { column, points, sample } from '../../../src/engine/points';
import { OneColumnMap } from '../../../src/engine/quantile/one-column-map';
import { quantileMethod } from '../../../src/engine/quantile/quantile-method';

describe('quantile/one-column-map', () => {
  const s = sample([
    [0, 0],
    [1, 10],
    [2, 20],
  ]);
  const t = sample([
    [5, 1],
    [6, 2],
    [7, 3],
  ]);
  const m = quantileMethod.fit(s, t, prepareFit(quantileMethod, s, t, {}), {}) as OneColumnMap;

  test('column k of the output depends only on column k of the input', () => {
    const r = m.apply(
      points([
        [0.5, 20],
        [0.5, 0],
      ]),
    );
    // Source: hand computation of the sorted matchings 0,1,2 -> 5,6,7 and 0,10,20 -> 1,2,3, interpolated linearly
    expect(Array.from(r.data)).toEqual([5.5, 3, 5.5, 1]);
  });

  test('a row is outside once, however many of its values are outside', () => {
    expect(
      m.apply(
        points([
          [-1, 99],
          [1, 10],
          [1, 99],
        ]),
      ).outside,
    ).toBe(2);
  });

  test('shape mismatch is refused by the base map', () => {
    expect(() => m.apply(column([1, 2]))).toThrow(/fitted on 2/);
  });

  test('params list one entry per column', () => {
    expect((m.toJSON().params as { columns: unknown[] }).columns.length).toBe(2);
  });
});
