import { parseMapJSON } from '../engine/map-json';
import { restoreMap } from '../engine/methods';
import { forget, watchFits } from '../fits';
import type { KeptMap } from '../workbook/map-store';
import { reenterFormula, selectRange } from '../workbook/ranges';
import { $, listItem, messageOf, redrawKeepingFocus, setStatus } from './dom';
import { budgetMsFor } from './method-section';
import { pane } from './pane-state';
import { num } from './plain-words';
import { hideProgress, resetProgress, updateProgress } from './progress-view';
import { showResults } from './results-section';

/* Maps in this workbook: each kept map with Inspect, Fit again, Export JSON and Delete. */

/** Lists the maps kept in the workbook. */
export async function refreshMaps(): Promise<void> {
  const ul = $('maps');
  try {
    const maps = await pane.store.list();
    const items = maps.length === 0 ? [listItem('No maps are kept in this workbook yet.', 'muted')] : maps.map(mapItem);
    redrawKeepingFocus(ul, items, $('maps-refresh'));
  } catch (e) {
    ul.replaceChildren(listItem(`Could not read the maps: ${messageOf(e)}`, 'muted'));
  }
}

function mapItem(m: KeptMap): HTMLLIElement {
  const li = document.createElement('li');
  const name = document.createElement('span');
  name.className = 'name';
  name.textContent = `${m.method} \u00b7 ${m.rows.toLocaleString('en-US')} \u00d7 ${m.cols}`;
  const meta = document.createElement('span');
  meta.className = 'meta';
  const date = m.saved ? new Date(m.saved) : null;
  const when = date && !Number.isNaN(date.getTime()) ? date.toLocaleString() : 'date unknown';
  meta.textContent = `cost ${num(m.cost)} \u00b7 ${when}${m.cell ? ` \u00b7 ${m.cell}` : ''} \u00b7 ${(m.chars / 1000).toFixed(1)} k characters`;
  const meta2 = document.createElement('span');
  meta2.className = 'meta';
  meta2.textContent = m.handle;
  const actions = document.createElement('div');
  actions.className = 'actions';
  const button = (label: string, aria: string, f: () => void) => {
    const b = document.createElement('button');
    b.type = 'button';
    b.className = 'btn small';
    b.textContent = label;
    b.setAttribute('aria-label', `${aria} ${m.method} map ${m.handle}`);
    b.dataset.focusKey = `${label}:${m.handle}`;
    b.addEventListener('click', f);
    actions.append(b);
  };
  button('Inspect', 'Inspect', () => void inspect(m));
  button('Fit again', 'Fit again', () => void fitAgain(m));
  button('Export JSON', 'Export', () => void exportJson(m));
  button('Delete', 'Delete', () => void removeMap(m));
  li.append(name, meta, meta2, actions);
  return li;
}

async function inspect(m: KeptMap): Promise<void> {
  try {
    const json = await pane.store.load(m.handle);
    if (!json) throw new Error(`The map ${m.handle} is no longer in this workbook.`);
    const map = restoreMap(parseMapJSON(json));
    showResults(m.handle, map.diagnostics(), null, null);
    if (m.cell) void selectRange(pane.run, m.cell).catch(() => undefined);
    setStatus(`Showing the map ${m.handle}${m.cell ? ` made by ${m.cell}` : ''}.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
}

async function fitAgain(m: KeptMap): Promise<void> {
  if (!m.cell) {
    setStatus('No REMAP.FIT cell is recorded for this map: select the cell with its formula, or choose the ranges above and press Fit.', true);
    return;
  }
  try {
    forget(m.handle);
    await pane.store.remove(m.handle);
    resetProgress(`Fitting ${m.method} in ${m.cell}\u2026`, budgetMsFor(m.method), false);
    const stop = watchFits((h, p) => (h === m.handle ? updateProgress(p) : undefined));
    const formula = await reenterFormula(pane.run, m.cell);
    if (!formula) throw new Error(`${m.cell} no longer holds a formula; choose the ranges above and press Fit.`);
    setStatus(`Fitting again in ${m.cell}; the cell shows its progress, and clearing it cancels the fit.`);
    setTimeout(() => {
      stop();
      hideProgress();
      void refreshMaps();
    }, 1500);
  } catch (e) {
    hideProgress();
    setStatus(messageOf(e), true);
  }
}

async function exportJson(m: KeptMap): Promise<void> {
  try {
    const json = await pane.store.load(m.handle);
    if (!json) throw new Error(`The map ${m.handle} is no longer in this workbook.`);
    const url = URL.createObjectURL(new Blob([json], { type: 'application/json' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = `${m.handle.replace(/[^a-z0-9-]+/gi, '_')}.json`;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
    setStatus(`Exported ${a.download}; \`remap apply --model ${a.download}\` reads it.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
}

async function removeMap(m: KeptMap): Promise<void> {
  try {
    forget(m.handle);
    await pane.store.remove(m.handle);
    setStatus(`Deleted the map ${m.handle} from this workbook. A REMAP.FIT cell that makes it will fit and keep it again when recalculated.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
  void refreshMaps();
}
