import { plain, readNumbers, readRecord, sameLength } from '../../../src/engine/quantile/params';

describe('quantile/params', () => {
  test('readNumbers checks type, finiteness, order and length', () => {
    expect(Array.from(readNumbers({ a: [1, 1, 2] }, 'a', 'load', 'rising', 2))).toEqual([1, 1, 2]);
    expect(() => readNumbers({ a: [1, 1] }, 'a', 'load', 'strict', 2)).toThrow(/entry 2 of "a" \(1\) is out of order/);
    expect(() => readNumbers({ a: [1, 'x'] }, 'a', 'load', 'any', 1)).toThrow(/entry 2 of "a" is "x"/);
    expect(() => readNumbers({}, 'a', 'load', 'any', 1)).toThrow(/"a" is missing/);
    expect(() => readNumbers({ a: [] }, 'a', 'load', 'any', 1)).toThrow(/needs at least 1/);
  });

  test('readRecord refuses non-objects and sameLength mismatches', () => {
    expect(() => readRecord([1], 'load')).toThrow(/expected an object/);
    expect(() => sameLength(Float64Array.of(1), Float64Array.of(1, 2), 'xs and ys', 'load')).toThrow(/1 and 2 numbers/);
    expect(plain(Float64Array.of(0.1, 2))).toEqual([0.1, 2]);
  });
});
