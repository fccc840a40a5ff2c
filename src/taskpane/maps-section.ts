import { parseGroupedMapJSON, restoreGroupedMap } from '../engine/groups/grouped-json';
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
import { recallGrouped } from '../fits/grouped-store';
import { showGroupedResults } from './groups-view';
import { showResults } from './results-section';
import { mapSqlText, sqlDefaults } from './sql-export';

/*
 * Maps in this workbook: each kept map with Inspect, Fit again, Export JSON and
 * Delete, and SQL (the table and columns to map, asked with defaults from the
 * map's column names; Copy SQL and Save SQL). Maps by group are inspected as
 * their table of groups.
 */

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
  name.textContent = `${m.grouped ? 'by group, ' : ''}${m.method} \u00b7 ${m.rows.toLocaleString('en-US')} \u00d7 ${m.cols}`;
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
  li.append(name, meta, meta2, actions, sqlForm(m));
  return li;
}

/**
 * The SQL controls of one map: a disclosure (keyboard-operable) holding the
 * table and columns fields, filled when opened from the map's column names,
 * and Copy SQL / Save SQL. Where the clipboard is refused (Office hosts may
 * block it) the SQL is shown selected in a text area to copy by hand.
 */
function sqlForm(m: KeptMap): HTMLDetailsElement {
  const key = m.handle.replace(/[^a-z0-9]+/gi, '-');
  const details = document.createElement('details');
  details.className = 'sql-form';
  const summary = document.createElement('summary');
  summary.textContent = 'SQL';
  summary.setAttribute('aria-label', `SQL for the ${m.method} map ${m.handle}`);
  const field = (id: string, label: string, hint: string) => {
    const wrap = document.createElement('div');
    wrap.className = 'field';
    const l = document.createElement('label');
    l.htmlFor = id;
    l.textContent = label;
    const input = document.createElement('input');
    input.id = id;
    input.type = 'text';
    input.setAttribute('aria-describedby', `${id}-hint`);
    const h = document.createElement('span');
    h.id = `${id}-hint`;
    h.className = 'hint';
    h.textContent = hint;
    wrap.append(l, input, h);
    return { wrap, input };
  };
  const table = field(`sql-table-${key}`, 'Table', 'The table or view holding the rows to map (schema.table works).');
  const columns = field(`sql-columns-${key}`, 'Columns', "The table's columns to map, separated by commas, in the map's order.");
  // Maps by group only: the column holding each row's group (shown once the map is known to be one).
  const groupColumn = field(`sql-group-${key}`, 'Group column', "The table's column holding each row's group (text, or whole numbers).");
  groupColumn.wrap.hidden = true;
  const out = document.createElement('textarea');
  out.readOnly = true;
  out.hidden = true;
  out.setAttribute('aria-label', `SQL of the map ${m.handle}`);
  const actions = document.createElement('div');
  actions.className = 'actions';
  const button = (label: string, f: () => void) => {
    const b = document.createElement('button');
    b.type = 'button';
    b.className = 'btn small';
    b.textContent = label;
    b.setAttribute('aria-label', `${label} for the ${m.method} map ${m.handle}`);
    b.dataset.focusKey = `${label}:${m.handle}`;
    b.addEventListener('click', f);
    actions.append(b);
  };
  const sql = async (): Promise<string> => {
    const json = await pane.store.load(m.handle);
    if (!json) throw new Error(`The map ${m.handle} is no longer in this workbook.`);
    return mapSqlText(json, table.input.value, columns.input.value, groupColumn.input.value);
  };
  button('Copy SQL', () => void copySql(sql, out));
  button('Save SQL', () => void saveSql(sql, m));
  details.addEventListener('toggle', () => {
    if (!details.open || table.input.value !== '') return;
    void pane.store.load(m.handle).then(
      (json) => {
        const d = sqlDefaults(json ?? '');
        table.input.value = d.table;
        columns.input.value = d.columns;
        if (d.groupColumn !== null) {
          groupColumn.input.value = d.groupColumn;
          groupColumn.wrap.hidden = false;
        }
      },
      () => undefined,
    );
  });
  details.append(summary, table.wrap, columns.wrap, groupColumn.wrap, actions, out);
  return details;
}

async function copySql(sql: () => Promise<string>, out: HTMLTextAreaElement): Promise<void> {
  let text: string;
  try {
    text = await sql();
  } catch (e) {
    out.hidden = true;
    setStatus(messageOf(e), true); // the engine's refusal (entropic, pairs) says what to do instead
    return;
  }
  try {
    await navigator.clipboard.writeText(text);
    out.hidden = true;
    setStatus(`Copied the SQL (${text.length.toLocaleString('en-US')} characters) to the clipboard.`);
  } catch {
    // The host refused the clipboard: show the text selected, to copy with Ctrl+C (Cmd+C).
    out.value = text;
    out.hidden = false;
    out.focus();
    out.select();
    setStatus('The clipboard is not available here: the SQL is shown below, selected; press Ctrl+C (Cmd+C on a Mac) to copy it.');
  }
}

async function saveSql(sql: () => Promise<string>, m: KeptMap): Promise<void> {
  try {
    const text = await sql();
    const url = URL.createObjectURL(new Blob([text], { type: 'application/sql' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = `${m.handle.replace(/[^a-z0-9-]+/gi, '_')}.sql`;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
    setStatus(`Saved ${a.download}; run it in DuckDB, Spark SQL or Trino against the table named in it.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
}

async function inspect(m: KeptMap): Promise<void> {
  try {
    if (m.grouped) {
      const known = recallGrouped(m.handle);
      const json = known ? null : await pane.store.load(m.handle);
      if (!known && !json) throw new Error(`The map ${m.handle} is no longer in this workbook.`);
      const grouped = known ?? restoreGroupedMap(parseGroupedMapJSON(json as string));
      showGroupedResults(m.handle, grouped.report(), m.cell || undefined);
    } else {
      const json = await pane.store.load(m.handle);
      if (!json) throw new Error(`The map ${m.handle} is no longer in this workbook.`);
      const map = restoreMap(parseMapJSON(json));
      showResults(m.handle, map.diagnostics(), null, null);
    }
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
