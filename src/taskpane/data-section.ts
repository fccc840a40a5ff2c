import { readSample } from '../input';
import { readValues, selectedAddress } from '../workbook/ranges';
import { $, messageOf, setStatus } from './dom';
import { updateMethodInfo } from './method-section';
import { pane } from './pane-state';

/* Section 1, Data: the source and target ranges (and optional weights), with a line describing what was read. */

/** The range inputs a fit reads, in the order source, target, source weights, target weights. */
export const RANGE_INPUTS = ['source', 'target', 'source-weights', 'target-weights'] as const;

/** Puts the workbook's selected address into an input and tells its listeners. */
export async function pickInto(inputId: string): Promise<void> {
  try {
    const address = await selectedAddress(pane.run);
    const input = $<HTMLInputElement>(inputId);
    input.value = address;
    input.dispatchEvent(new Event('change'));
  } catch (e) {
    setStatus(`Could not read the selection: ${messageOf(e)}`, true);
  }
}

/** Cells of a range for the fit, or null for an empty address. */
export async function cellsOf(inputId: string): Promise<unknown[][] | null> {
  const address = $<HTMLInputElement>(inputId).value.trim();
  return address ? readValues(pane.run, address) : null;
}

/** Reads the source or target range and says what it holds (rows, columns, names, skipped entries). */
export async function describeSample(which: 'source' | 'target'): Promise<void> {
  const info = $(`${which}-info`);
  pane.samples[which] = null;
  info.classList.remove('bad');
  const address = $<HTMLInputElement>(which).value.trim();
  if (!address) {
    info.textContent = '';
    updateMethodInfo();
    return;
  }
  try {
    const cells = await readValues(pane.run, address);
    const s = readSample(cells, { name: which, fn: 'Remap pane' });
    pane.samples[which] = s;
    const names = s.columns ? ` (${s.columns.join(', ')})` : '';
    const rows = `${s.sample.n.toLocaleString('en-US')} rows \u00d7 ${s.sample.d} column${s.sample.d === 1 ? '' : 's'}`;
    info.textContent = `${rows}${names}${s.dropped ? `; ${s.dropped} entries skipped` : ''}.`;
  } catch (e) {
    info.textContent = messageOf(e);
    info.classList.add('bad');
  }
  updateMethodInfo();
}
