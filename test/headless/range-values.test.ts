import { rangeNumbers } from '../../src/headless/range-values';

describe('rangeNumbers', () => {
  test('reads a block row-major, with non-numbers as NaN', () => {
    // Source: worked example
    const values = {
      Data: [
        [1, 2],
        ['x', 4],
        [null, { error: '#N/A', message: '' }],
      ],
    };
    const r = rangeNumbers(values, 'Data!A1:B3');
    expect(r.rows).toBe(3);
    expect(r.cols).toBe(2);
    expect(Array.from(r.data)).toEqual([1, 2, NaN, 4, NaN, NaN]);
    expect(Array.from(rangeNumbers({ 'My sheet': [[7]] }, "'My sheet'!A1").data)).toEqual([7]);
  });
  test('names the problem for an unknown sheet or a missing sheet name', () => {
    expect(() => rangeNumbers({ A: [] }, 'B!A1')).toThrow(/no sheet "B"/);
    expect(() => rangeNumbers({ A: [] }, 'A1')).toThrow(/names no sheet/);
  });
});
