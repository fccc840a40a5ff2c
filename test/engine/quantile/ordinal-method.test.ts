import { prepareFit } from '../../../src/engine/methods';
import { column, sample, type Sample } from '../../../src/engine/points';
import { ordinalMethod } from '../../../src/engine/quantile/ordinal-method';
import { RemapError } from '../../../src/engine/errors';
import type { TransportMap } from '../../../src/engine/map';

function fit(s: Sample, t: Sample, raw: Record<string, unknown> = {}, columns?: string[]): TransportMap {
  return ordinalMethod.fit(s, t, prepareFit(ordinalMethod, s, t, raw), { columns }) as TransportMap;
}
const apply = (m: TransportMap, xs: number[]) => Array.from(m.apply(column(xs)).data);

describe('ordinal method', () => {
  test('the spec: one-column, weights, 2 rows minimum', () => {
    expect(ordinalMethod.name).toBe('ordinal');
    expect(ordinalMethod.shape).toBe('one-column');
    expect(ordinalMethod.weights).toBe(true);
    expect(ordinalMethod.minRows(1)).toBe(2);
  });

  test('non-integer fitting data is refused with a message pointing to method quantile', () => {
    expect(() => fit(sample([1, 2.5, 3]), sample([1, 2]))).toThrow(RemapError);
    expect(() => fit(sample([1, 2.5, 3]), sample([1, 2]))).toThrow(/fit \(ordinal\): source, row 2 holds 2.5.*method quantile/);
    expect(() => fit(sample([1, 2]), sample([0.25, 2]))).toThrow(/target, row 1 holds 0.25/);
    expect(() =>
      fit(
        sample([
          [1, 2],
          [3, 4],
        ]),
        sample([
          [1, 2],
          [3, 4.5],
        ]),
        {},
        ['Math', 'Reading'],
      ),
    ).toThrow(/column "Reading": target, row 2/);
  });

  test('a score with zero frequency in the target is stepped over', () => {
    // Source: Kolen & Brennan ch. 2, by hand: P(0) = 0.25 -> 0, P(1) = 0.75 -> past the empty score 1 -> 2
    const m = fit(sample([0, 1]), sample([0, 2]));
    expect(apply(m, [0, 1])).toEqual([0, 2]);
  });

  test('frequencies as weights equal repeated rows', () => {
    const a = fit(sample([0, 1, 2], [2, 3, 1]), sample([0, 1, 2, 3]));
    const b = fit(sample([0, 0, 1, 1, 1, 2]), sample([0, 1, 2, 3]));
    expect(apply(a, [0, 1, 2])).toEqual(apply(b, [0, 1, 2]));
  });

  test('invert follows the same rule the other way and undoes apply on an equal-shape pair', () => {
    const m = fit(sample([0, 1, 1, 2]), sample([10, 11, 11, 12]));
    expect(apply(m, [0, 1, 2])).toEqual([10, 11, 12]);
    expect(Array.from(m.invert(column([10, 11, 12])).data)).toEqual([0, 1, 2]);
  });

  test('values outside the continuised range count as outside and clamp to its ends', () => {
    const m = fit(sample([0, 1, 2]), sample([0, 1, 2]));
    const r = m.apply(column([-3, 5]));
    expect(Array.from(r.data)).toEqual([-0.5, 2.5]);
    expect(r.outside).toBe(2);
  });

  test('toJSON / fromJSON is bit-identical', () => {
    const m = fit(sample([0, 0, 1, 1, 1, 2, 2, 3, 3, 4]), sample([0, 1, 1, 2, 2, 3, 3, 3, 4, 4]), { tails: 'linear' });
    const back = ordinalMethod.fromJSON(JSON.parse(JSON.stringify(m.toJSON())));
    const probe = column([-2, 0, 0.3, 1, 2, 2.5, 3, 4, 7]);
    expect(Array.from(back.apply(probe).data)).toEqual(Array.from(m.apply(probe).data));
    expect(Array.from(back.invert(probe).data)).toEqual(Array.from(m.invert(probe).data));
  });
});
