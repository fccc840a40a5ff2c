import type { Diagnostics } from '../engine/map';
import { warningsInWords } from './plain-words';

/**
 * What the pane says about one REMAP formula found in the workbook: which
 * function it calls and, for those that fit a map, the map's warnings in words
 * (or, with none, a reminder that the map is an estimate to validate). Pure; no
 * DOM, no Office.
 */

/** The reminder shown for a map without warnings: no warning is not the same as validated. */
export const ESTIMATE_REMINDER =
  'No warnings. The map is still an estimate from two samples: check it (for example on held-out rows) before it drives a decision.';

/** Functions whose cell fits (or restores) a map of its own. */
const FITTING = new Set(['VALUES', 'COST', 'FIT', 'PAIRS', 'LOAD']);
/** Functions that use the map held in another cell. */
const USING = new Set(['APPLY', 'INVERT', 'REPORT', 'SAVE']);

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
 * What to say about a formula, given its map's diagnostics when the map is
 * known (undefined when it is not). O(#warnings).
 * @example formulaStatus('=REMAP.VALUES(A2:A9,A2:A9,B2:B9)', undefined).kind // 'unknown'
 */
export function formulaStatus(formula: string, diag: Diagnostics | undefined): FormulaStatus {
  const fn = remapFunctionOf(formula);
  if (fn === 'GAUSSCOST') {
    return {
      fn,
      kind: 'other',
      lines: [{ title: 'Closed form', text: 'The cost between two Gaussians given by their means and covariances; no map is fitted to data.' }],
    };
  }
  if (USING.has(fn)) {
    return {
      fn,
      kind: 'other',
      lines: [{ title: 'Uses another cell\u2019s map', text: 'Its warnings are listed with the REMAP.FIT (or REMAP.LOAD) cell it names.' }],
    };
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
  const warnings = warningsInWords(diag.warnings);
  if (warnings.length === 0) return { fn, kind: 'clean', lines: [{ title: 'No warnings', text: ESTIMATE_REMINDER }] };
  return { fn, kind: 'warnings', lines: warnings.map((w) => ({ title: w.title, text: `${w.text} What to do: ${w.action}` })) };
}
