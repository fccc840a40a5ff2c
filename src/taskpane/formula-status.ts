import type { Diagnostics, Warning } from '../engine/map';
import { ESTIMATE_REMINDER as ENGINE_REMINDER } from '../engine/base';
import { warningsInWords } from './plain-words';

/**
 * What the pane says about one REMAP formula found in the workbook: which
 * function it calls; for those that fit a map, the map's warnings in words (or,
 * with none, the reminder that the map is an estimate to validate); and for
 * those that map values (VALUES, APPLY, INVERT, TOTABLE), the warnings about that
 * cell's own values, such as rows outside the fitted range. Pure; no DOM, no
 * Office.
 */

/** The line shown for a formula without warnings: no warning is not the same as validated. */
export function noWarningsLine(reminder: string = ENGINE_REMINDER): string {
  return `No warnings. ${reminder}`;
}

/** The same line with the engine's reminder. */
export const ESTIMATE_REMINDER = noWarningsLine();

/** Functions whose cell fits (or restores) a map of its own (a map by group for FITGROUPS and BYGROUP). */
const FITTING = new Set(['VALUES', 'COST', 'FIT', 'PAIRS', 'LOAD', 'TOTABLE', 'FITGROUPS', 'BYGROUP']);
/** Functions that use the map held in another cell. */
const USING = new Set(['APPLY', 'INVERT', 'REPORT', 'SAVE', 'APPLYGROUPS', 'GROUPREPORT']);
/** Functions that map values, whose own values may lie outside the fitted range. */
const MAPPING = new Set(['VALUES', 'APPLY', 'INVERT', 'TOTABLE']);

/** What the list needs of a map: its warnings and its reminder (a map by group's are gathered by `groupedWarnings`). */
export type MapFacts = Pick<Diagnostics, 'warnings' | 'reminder'>;

/** One line of the pane's "Formulas in this workbook" list. */
export interface FormulaStatus {
  /** The REMAP function the formula calls first (e.g. "VALUES"), or "" if none is recognised. */
  readonly fn: string;
  /** 'warnings': the map has some; 'clean': it has none; 'unknown': its map is not known in this session; 'other': no map of its own. */
  readonly kind: 'warnings' | 'clean' | 'unknown' | 'other';
  /** Sentences to show under the formula. */
  readonly lines: readonly { readonly title: string; readonly text: string }[];
}

/**
 * The REMAP function a formula calls first, upper case ("" for none). O(length).
 * @example remapFunctionOf('=ROUND(REMAP.COST(A1:A9,B1:B9),2)') // 'COST'
 */
export function remapFunctionOf(formula: string): string {
  const m = /\bREMAP\.([A-Z]+)\s*\(/i.exec(formula);
  return m ? m[1].toUpperCase() : '';
}

/**
 * What to say about a formula, given its map's warnings and reminder when the map is
 * known (undefined when it is not) and the warnings of the cell's own last call
 * (undefined when the cell has not mapped values in this session). O(#warnings).
 * @example formulaStatus('=REMAP.VALUES(A2:A9,A2:A9,B2:B9)', undefined).kind // 'unknown'
 */
export function formulaStatus(formula: string, diag: MapFacts | undefined, calls?: readonly Warning[]): FormulaStatus {
  const fn = remapFunctionOf(formula);
  if (fn === 'GAUSSCOST') {
    return {
      fn,
      kind: 'other',
      lines: [{ title: 'Closed form', text: 'The cost between two Gaussians given by their means and covariances; no map is fitted to data.' }],
    };
  }
  const own = MAPPING.has(fn) && calls ? inWords(calls) : [];
  if (USING.has(fn)) {
    const pointer = { title: 'Uses another cell\u2019s map', text: 'The map\u2019s own warnings are listed with the REMAP.FIT (or REMAP.LOAD) cell it names.' };
    if (MAPPING.has(fn) && !calls) {
      return {
        fn,
        kind: 'unknown',
        lines: [{ title: 'Not calculated in this session', text: 'Recalculate it to see whether its values lay outside the fitted range.' }, pointer],
      };
    }
    return { fn, kind: own.length > 0 ? 'warnings' : 'other', lines: [...own, pointer] };
  }
  if (!FITTING.has(fn)) return { fn, kind: 'other', lines: [] };
  if (!diag) {
    return {
      fn,
      kind: 'unknown',
      lines: [
        {
          title: 'Not calculated in this session',
          text: 'Recalculate it (Formulas > Calculate Now, or press Fit again in the list of maps) to see its map\u2019s warnings here.',
        },
      ],
    };
  }
  const lines = [...inWords(diag.warnings), ...own];
  if (lines.length === 0) return { fn, kind: 'clean', lines: [{ title: 'No warnings', text: noWarningsLine(diag.reminder) }] };
  return { fn, kind: 'warnings', lines };
}

function inWords(ws: readonly Warning[]): { title: string; text: string }[] {
  return warningsInWords(ws).map((w) => ({ title: w.title, text: `${w.text} What to do: ${w.action}` }));
}
