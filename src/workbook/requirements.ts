/**
 * The Office requirement sets the add-in's code needs (manifest.xml declares
 * the same), and which of them the running Office lacks.
 */

/** A requirement set and the lowest version the code needs. */
export interface RequirementSet {
  readonly name: string;
  readonly version: string;
  /** What stops working without it, in a few words. */
  readonly why: string;
}

export const REQUIRED_SETS: readonly RequirementSet[] = [
  { name: 'ExcelApi', version: '1.7', why: 'reading ranges by position, charts, and keeping maps in the workbook (custom XML parts, 1.5)' },
  { name: 'CustomFunctionsRuntime', version: '1.1', why: 'the REMAP worksheet functions' },
  { name: 'SharedRuntime', version: '1.1', why: 'the pane and the functions sharing one runtime' },
];

/** What Office.context.requirements offers (or a test's fake). */
export interface RequirementChecker {
  isSetSupported(name: string, version?: string): boolean;
}

/**
 * The required sets the host does not support; empty when all are there or when
 * there is nothing to ask (outside Office). O(#sets).
 * @example missingRequirements({ isSetSupported: (n) => n !== 'ExcelApi' }) // [{ name: 'ExcelApi', version: '1.7', ... }]
 */
export function missingRequirements(checker: RequirementChecker | null | undefined): RequirementSet[] {
  if (!checker || typeof checker.isSetSupported !== 'function') return [];
  return REQUIRED_SETS.filter((s) => {
    try {
      return !checker.isSetSupported(s.name, s.version);
    } catch {
      return false;
    }
  });
}

/** The running Office's checker, or null outside Office. */
export function officeRequirements(): RequirementChecker | null {
  return typeof Office !== 'undefined' && Office.context && Office.context.requirements ? Office.context.requirements : null;
}
