import { parseA1, type CellResult } from './workbook-io';

/**
 * Reads a block of computed values, written "Sheet!A2:C100", as numbers
 * (row-major; anything that is not a finite number becomes NaN, so plots and
 * checks skip it). Sheet names may be quoted ('My sheet'!A1:A9).
 * Cost: O(cells in the block).
 * @throws Error for an unknown sheet or a reference that is not A1.
 * @example rangeNumbers({ S: [[1], ['x']] }, 'S!A1:A2') // { rows: 2, cols: 1, data: [1, NaN] }
 */
export function rangeNumbers(values: Readonly<Record<string, CellResult[][]>>, ref: string): { rows: number; cols: number; data: Float64Array } {
  const bang = ref.lastIndexOf('!');
  if (bang < 0) throw new Error(`"${ref}" names no sheet; write it as Sheet!A1:B10.`);
  const sheet = ref
    .slice(0, bang)
    .replace(/^'(.*)'$/, '$1')
    .replace(/''/g, "'");
  const grid = values[sheet];
  if (!grid) throw new Error(`There is no sheet "${sheet}" (sheets: ${Object.keys(values).join(', ')}).`);
  const { r0, c0, r1, c1 } = parseA1(ref.slice(bang + 1));
  const rows = r1 - r0 + 1;
  const cols = c1 - c0 + 1;
  const data = new Float64Array(rows * cols);
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < cols; j++) {
      const v = grid[r0 + i]?.[c0 + j];
      data[i * cols + j] = typeof v === 'number' && Number.isFinite(v) ? v : NaN;
    }
  }
  return { rows, cols, data };
}
