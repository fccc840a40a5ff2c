import type { SimpleCellAddress } from 'hyperformula';

/**
 * What one headless workbook run shares with the REMAP function plugin while
 * HyperFormula evaluates: fits still training (HyperFormula cannot wait for
 * them), fits that failed, and the size announced for each spilled result.
 * HyperFormula evaluates synchronously, so a module-level "current run" is
 * safe as long as runs do not overlap; runWorkbook runs them one at a time.
 */
export interface RunContext {
  /** Background fits started while evaluating, by formula cell ("sheet:row:col"); settle to undefined. */
  readonly pending: Map<string, Promise<void>>;
  /** The spreadsheet error a background fit ended with, by formula cell, returned on later passes instead of fitting again. */
  readonly failures: Map<string, unknown>;
  /** Rows and columns reserved for each spilled result, by formula cell. */
  readonly spills: Map<string, { readonly rows: number; readonly cols: number }>;
}

let current: RunContext | null = null;

/** A fresh, empty run context. O(1). */
export function newRunContext(): RunContext {
  return { pending: new Map(), failures: new Map(), spills: new Map() };
}

/** The run HyperFormula is evaluating for now, or null outside runWorkbook. */
export function currentRun(): RunContext | null {
  return current;
}

/** Sets (or clears, with null) the current run. */
export function setCurrentRun(ctx: RunContext | null): void {
  current = ctx;
}

/** The key of a formula cell in a RunContext: "sheet:row:col" (0-based, HyperFormula's sheet id). O(1). */
export function cellKey(a: SimpleCellAddress): string {
  return `${a.sheet}:${a.row}:${a.col}`;
}
