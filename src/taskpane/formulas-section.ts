import { ESTIMATE_REMINDER } from '../engine/base';
import { parseGroupedMapJSON, restoreGroupedMap } from '../engine/groups/grouped-json';
import { parseMapJSON } from '../engine/map-json';
import { restoreMap } from '../engine/methods';
import { cellMap, groupedWarnings, isHandle, recall } from '../fits';
import { isGroupedHandle, recallGrouped } from '../fits/grouped-store';
import { findRemapFormulas, type FoundFormula } from '../workbook/formulas';
import { selectRange } from '../workbook/ranges';
import { $, listItem, messageOf, redrawKeepingFocus } from './dom';
import { formulaStatus, remapFunctionOf, type MapFacts } from './formula-status';
import { pane } from './pane-state';

/*
 * Formulas in this workbook: every REMAP formula found in the sheets' used
 * ranges, with its map's warnings in words, so someone who only types
 * REMAP.VALUES still sees what the map's report would tell them, and, for a
 * cell that mapped values (VALUES, APPLY, INVERT), how many of its own values
 * lay outside the fitted range and what the method did with them.
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
  if (fn === 'FITGROUPS' && typeof f.value === 'string' && isGroupedHandle(f.value)) return f.value.trim();
  return cellMap(f.address)?.handle;
}

/** The map's warnings and reminder: from this session's maps, else from the workbook's kept copy; a map by group's from all its groups. */
async function diagnosticsOf(handle: string | undefined): Promise<MapFacts | undefined> {
  if (!handle) return undefined;
  const grouped = isGroupedHandle(handle);
  const known = grouped ? recallGrouped(handle) : recall(handle);
  try {
    if (known) return 'entries' in known ? { warnings: groupedWarnings(known.report()), reminder: ESTIMATE_REMINDER } : known.diagnostics();
    const json = await pane.store.load(handle);
    if (!json) return undefined;
    return grouped
      ? { warnings: groupedWarnings(restoreGroupedMap(parseGroupedMapJSON(json)).report()), reminder: ESTIMATE_REMINDER }
      : restoreMap(parseMapJSON(json)).diagnostics();
  } catch {
    return undefined;
  }
}

async function formulaItem(f: FoundFormula): Promise<HTMLLIElement> {
  const fn = remapFunctionOf(f.formula);
  const uses = fn === 'APPLY' || fn === 'INVERT' || fn === 'REPORT' || fn === 'SAVE';
  const status = formulaStatus(f.formula, uses ? undefined : await diagnosticsOf(handleOf(f)), cellMap(f.address)?.calls);
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
