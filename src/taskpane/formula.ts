/**
 * The formulas the pane writes, so the workbook stays the record of every fit:
 * `=REMAP.FIT(...)` and `=REMAP.APPLY(...)` / `=REMAP.INVERT(...)`, built from
 * addresses and texts. Pure functions: no Office, no DOM.
 */

/** What a REMAP.FIT formula is made of: addresses ("Sheet1!A1:B500") and texts. */
export interface FitFormulaParts {
  readonly source: string;
  readonly target: string;
  /** A method name or "auto"; "" leaves it out. */
  readonly method: string;
  /** Settings text such as "seed=7; tails=linear"; "" leaves it out. */
  readonly settings: string;
  readonly sourceWeights: string;
  readonly targetWeights: string;
}

/**
 * A text as an Excel string literal: in double quotes, inner quotes doubled. O(length).
 * @example excelString('say "hi"') // '"say ""hi"""'
 */
export function excelString(text: string): string {
  return `"${text.replace(/"/g, '""')}"`;
}

/**
 * The REMAP.FIT formula for `parts`; empty trailing arguments are left out and
 * empty middle ones left blank, as Excel reads optional arguments. O(length).
 * @throws Error when the source or target address is missing.
 * @example fitFormula({ source: 'Sheet1!A1:A9', target: 'Sheet1!B1:B9', method: 'auto', settings: '', sourceWeights: '', targetWeights: '' })
 *   // '=REMAP.FIT(Sheet1!A1:A9,Sheet1!B1:B9,"auto")'
 */
export function fitFormula(parts: FitFormulaParts): string {
  if (!parts.source.trim() || !parts.target.trim()) throw new Error('Choose a source range and a target range first.');
  const args = [
    parts.source.trim(),
    parts.target.trim(),
    parts.method.trim() ? excelString(parts.method.trim()) : '',
    parts.settings.trim() ? excelString(parts.settings.trim()) : '',
    parts.sourceWeights.trim(),
    parts.targetWeights.trim(),
  ];
  while (args.length > 2 && args[args.length - 1] === '') args.pop();
  return `=REMAP.FIT(${args.join(',')})`;
}

/**
 * The formula that applies (or inverts) the map whose handle is in `modelCell` to `values`. O(length).
 * @throws Error when an address is missing.
 * @example applyFormula('Sheet1!F2', 'Sheet2!A2:A100', 'apply') // '=REMAP.APPLY(Sheet1!F2,Sheet2!A2:A100)'
 */
export function applyFormula(modelCell: string, values: string, direction: 'apply' | 'invert'): string {
  if (!modelCell.trim()) throw new Error('Choose the cell that holds the map (the REMAP.FIT cell).');
  if (!values.trim()) throw new Error('Choose the values to map.');
  return `=REMAP.${direction === 'invert' ? 'INVERT' : 'APPLY'}(${modelCell.trim()},${values.trim()})`;
}
