import type { Diagnostics } from '../engine/map';
import { parseMapJSON } from '../engine/map-json';
import { restoreMap } from '../engine/methods';
import { cellMap, isHandle, recall } from '../fits';
import { findRemapFormulas, type FoundFormula } from '../workbook/formulas';
import { selectRange } from '../workbook/ranges';
import { $, listItem, messageOf, redrawKeepingFocus } from './dom';
import { formulaStatus, remapFunctionOf } from './formula-status';
import { pane } from './pane-state';

/*
 * Formulas in this workbook: every REMAP formula found in the sheets' used
 * ranges, with its map's warnings in words, so someone who only types
 * REMAP.VALUES still sees what the map's report would tell them.
 */

/** Finds the REMAP formulas and lists each with its map's warnings. */
export async function refreshFormulas(): Promise<void> {
  const ul = $('formulas');
  const note = $('formulas-note');
  ul.setAttribute('aria-busy', 'true');
  try {
    const found = await findRemapFormulas(pane.run);
    const items = await Promise.all(found.formulas.map(formulaItem));
    redrawKeepingFocus(ul, items.length === 0 ? [listItem('No REMAP formulas in this workbook yet.', 'muted')] : items, $('formulas-refresh'));
    const left = [
      found.truncated ? 'Only the first 500 formulas are listed.' : '',
      found.skippedSheets.length ? `Sheets too large to search: ${found.skippedSheets.join(', ')}.` : '',
    ].filter(Boolean);
    note.textContent = left.join(' ');
  } catch (e) {
    ul.replaceChildren(listItem(`Could not read the formulas: ${messageOf(e)}`, 'muted'));
  } finally {
    ul.removeAttribute('aria-busy');
  }
}

/** The handle of the map a formula cell fitted or restored, if this session (or the cell's value) tells it. */
function handleOf(f: FoundFormula): string | undefined {
  const fn = remapFunctionOf(f.formula);
  if ((fn === 'FIT' || fn === 'LOAD') && typeof f.value === 'string' && isHandle(f.value)) return f.value.trim();
  return cellMap(f.address)?.handle;
}

/** The map's diagnostics: from this session's maps, else from the workbook's kept copy. */
async function diagnosticsOf(handle: string | undefined): Promise<Diagnostics | undefined> {
  if (!handle) return undefined;
  const known = recall(handle);
  if (known) return known.diagnostics();
  try {
    const json = await pane.store.load(handle);
    return json ? restoreMap(parseMapJSON(json)).diagnostics() : undefined;
  } catch {
    return undefined;
  }
}

async function formulaItem(f: FoundFormula): Promise<HTMLLIElement> {
  const status = formulaStatus(f.formula, await diagnosticsOf(handleOf(f)));
  const li = document.createElement('li');
  li.className = `formula-item ${status.kind}`;
  const head = document.createElement('button');
  head.type = 'button';
  head.className = 'link';
  head.textContent = f.address;
  head.setAttribute('aria-label', `Select ${f.address}`);
  head.dataset.focusKey = f.address;
  head.addEventListener('click', () => void selectRange(pane.run, f.address).catch(() => undefined));
  const code = document.createElement('code');
  code.textContent = f.formula.length > 120 ? `${f.formula.slice(0, 117)}\u2026` : f.formula;
  const lines = document.createElement('ul');
  lines.className = 'formula-lines';
  for (const l of status.lines) {
    const item = document.createElement('li');
    const title = document.createElement('strong');
    title.textContent = `${l.title}: `;
    item.append(title, l.text);
    lines.append(item);
  }
  li.append(head, ' ', code, lines);
  return li;
}
