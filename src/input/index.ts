/* Input: the one place where cells (Excel, a headless spreadsheet engine) and
 * CSV fields become samples and points, and results become cells again
 * (README, "Input rules"). It imports only the engine. */
export { type CellIn, type CellOut, type Grid, type CellKind, CellError, cellKind } from './cells';
export {
  type ReadSample,
  type ReadSampleOptions,
  type ValuesLayout,
  asRows,
  readSample,
  readValues,
  writeValues,
  readNumbers,
  isOmitted,
  readText,
  readSettings,
} from './coerce';
