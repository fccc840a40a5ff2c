import { writeFormula } from '../workbook/ranges';
import { $, messageOf, setStatus } from './dom';
import { applyFormula } from './formula';
import { pane } from './pane-state';

/* Section 5, Apply a map: writes REMAP.APPLY (or REMAP.INVERT) where asked. */

/** Writes the apply (or invert) formula the inputs describe. */
export async function writeApply(): Promise<void> {
  const v = (id: string) => $<HTMLInputElement>(id).value.trim();
  try {
    const formula = applyFormula(v('apply-model'), v('apply-values'), $<HTMLSelectElement>('apply-direction').value === 'invert' ? 'invert' : 'apply');
    if (!v('apply-out')) throw new Error('Choose the cell where the results start.');
    const at = await writeFormula(pane.run, v('apply-out'), formula);
    setStatus(`Wrote ${formula} in ${at}.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
}
