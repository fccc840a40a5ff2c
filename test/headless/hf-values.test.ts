import { CellError as HfCellError, EmptyValue, ErrorType, SimpleRangeValue } from 'hyperformula';
import { CellError } from '../../src/input/cells';
import { argFromHf, cellFromHf, cellToHf, gridToHf, hfErrorFactory } from '../../src/headless/hf-values';

describe('values in from HyperFormula', () => {
  test('EmptyValue is a blank, HyperFormula errors are error cells, formatted numbers are numbers', () => {
    // Source: src/input/cells.ts (blank is null; error cells are CellError)
    expect(cellFromHf(EmptyValue)).toBeNull();
    expect(cellFromHf(3)).toBe(3);
    expect(cellFromHf('x')).toBe('x');
    expect(cellFromHf(true)).toBe(true);
    const e = cellFromHf(new HfCellError(ErrorType.NUM, 'bad'));
    expect(e).toBeInstanceOf(CellError);
    expect((e as CellError).kind).toBe('num');
    expect(cellFromHf({ val: 0.25, format: '0%' })).toBe(0.25);
  });
  test('a range becomes a list of rows; a missing argument stays undefined', () => {
    // Source: src/input/coerce.ts (a range is a list of rows)
    expect(
      argFromHf(
        SimpleRangeValue.onlyValues([
          [1, EmptyValue],
          ['a', 2],
        ] as never),
      ),
    ).toEqual([
      [1, null],
      ['a', 2],
    ]);
    expect(argFromHf(undefined)).toBeUndefined();
  });
});

describe('values out to HyperFormula', () => {
  test('errors keep their type and message', () => {
    // Source: src/functions/excel-errors.ts (value -> #VALUE!, num -> #NUM!, na -> #N/A)
    const e = hfErrorFactory('na', 'no map') as HfCellError;
    expect(e.type).toBe(ErrorType.NA);
    expect(e.message).toBe('no map');
    const v = cellToHf(new CellError('value', 'Not a number')) as HfCellError;
    expect(v.type).toBe(ErrorType.VALUE);
    expect(v.message).toBe('Not a number');
    expect((cellToHf(NaN) as HfCellError).type).toBe(ErrorType.NUM);
    expect(cellToHf('')).toBe(EmptyValue);
  });
  test('a grid is padded with blanks to the announced size, and a longer one is cut with a note in its last row', () => {
    // Source: the function's contract
    expect(gridToHf([[1], [2]], 3, 1).data).toEqual([[1], [2], [EmptyValue]]);
    const cut = gridToHf(
      [
        ['a', 1],
        ['b', 2],
        ['c', 3],
        ['d', 4],
      ],
      3,
      2,
    ).data;
    expect(cut[0]).toEqual(['a', 1]);
    expect(cut[2][0]).toBe('(2 more rows not shown)');
  });
});
