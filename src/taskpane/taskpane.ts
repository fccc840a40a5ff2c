/**
 * The Remap pane: pick source and target ranges, a method and its settings,
 * fit with progress (step, loss, time left, Cancel), read the fit's
 * diagnostics, warnings and plots, insert a native chart, write APPLY
 * formulas, and manage the maps kept in the workbook.
 *
 * How a fit runs: the pane reads the cells, runs the fit in a Web Worker
 * (fit-runner.ts) through the same coercion and engine as REMAP.FIT, keeps the
 * map (in this runtime's store and in the workbook), and only then writes
 * `=REMAP.FIT(...)` into the chosen cell. The formula derives the same handle
 * from the same cells and finds the map at once, so the workbook stays the
 * record and nothing is fitted twice. UI only: every Office call is in src/workbook.
 */
import { chooseMethod } from '../engine/auto';
import { isRemapError } from '../engine/errors';
import type { Diagnostics, Progress } from '../engine/map';
import { parseMapJSON } from '../engine/map-json';
import { getMethod, listMethods, restoreMap, settingSpecs } from '../engine/methods';
import type { SettingSpec } from '../engine/settings';
import { ENFORCED_TIME_BUDGET, hasOwnTimeBudget, watchFits } from '../fits';
import { readSample, readSettings } from '../input/coerce';
import { forget, rememberAndKeep } from '../fits';
import { insertComparisonChart } from '../workbook/comparison-chart';
import { officeRun, type ExcelRun } from '../workbook/excel-run';
import { workbookKeeper } from '../workbook/keeper';
import type { KeptMap, WorkbookMapStore } from '../workbook/map-store';
import { readValues, reenterFormula, selectRange, selectedAddress, writeFormula } from '../workbook/ranges';
import type { FitDone } from './fit-messages';
import { FitRunner, type RunningFit } from './fit-runner';
import { applyFormula, fitFormula } from './formula';
import { listedFunctions } from './function-list';
import { lossCurve } from './loss-curve';
import { diagnosticsInWords, num, warningsInWords } from './plain-words';
import { chartTable, columnName, distributionSvg, qqSvg, scatterSvg, type PlotData } from './plots-view';
import { defaultText, settingsText } from './settings-text';
import { durationText, timeLeftMs } from './time-left';

export { listedFunctions } from './function-list';

const PLOT_WIDTH = 290;
const $ = <T extends HTMLElement = HTMLElement>(id: string): T => document.getElementById(id) as T;

let run: ExcelRun;
let store: WorkbookMapStore;
const runner = new FitRunner();
let running: RunningFit | null = null;
let shown: (PlotData & { handle: string }) | null = null;
const entered: Record<string, string> = {};

function setStatus(text: string, bad = false): void {
  const s = $('status');
  s.textContent = text;
  s.classList.toggle('bad', bad);
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/* ---------------- data ---------------- */

const RANGE_INPUTS = ['source', 'target', 'source-weights', 'target-weights'] as const;

async function pickInto(inputId: string): Promise<void> {
  try {
    const address = await selectedAddress(run);
    const input = $<HTMLInputElement>(inputId);
    input.value = address;
    input.dispatchEvent(new Event('change'));
  } catch (e) {
    setStatus(`Could not read the selection: ${messageOf(e)}`, true);
  }
}

/** Cells of a range for the fit, or null for an empty address. */
async function cellsOf(inputId: string): Promise<unknown[][] | null> {
  const address = $<HTMLInputElement>(inputId).value.trim();
  return address ? readValues(run, address) : null;
}

const samples: Record<'source' | 'target', ReturnType<typeof readSample> | null> = { source: null, target: null };

async function describeSample(which: 'source' | 'target'): Promise<void> {
  const info = $(`${which}-info`);
  samples[which] = null;
  info.classList.remove('bad');
  const address = $<HTMLInputElement>(which).value.trim();
  if (!address) {
    info.textContent = '';
    updateMethodInfo();
    return;
  }
  try {
    const cells = await readValues(run, address);
    const s = readSample(cells, { name: which, fn: 'Remap pane' });
    samples[which] = s;
    const names = s.columns ? ` (${s.columns.join(', ')})` : '';
    info.textContent = `${s.sample.n.toLocaleString('en-US')} rows \u00d7 ${s.sample.d} column${s.sample.d === 1 ? '' : 's'}${names}${s.dropped ? `; ${s.dropped} entries skipped` : ''}.`;
  } catch (e) {
    info.textContent = messageOf(e);
    info.classList.add('bad');
  }
  updateMethodInfo();
}

/* ---------------- method and settings ---------------- */

/** The method the fit will use: the chosen one, or what auto picks for the data read so far. */
function effectiveMethod(): { name: string; reason: string | null } {
  const chosen = $<HTMLSelectElement>('method').value;
  if (chosen !== 'auto') return { name: chosen, reason: null };
  const s = samples.source;
  const t = samples.target;
  if (!s || !t || s.sample.d !== t.sample.d) return { name: '', reason: null };
  let raw: Record<string, unknown> = {};
  try {
    raw = readSettings(currentSettingsText(), 'Remap pane');
  } catch {
    raw = {};
  }
  const c = chooseMethod(s.sample, t.sample, raw, true);
  return { name: c.method, reason: c.reason };
}

function updateMethodInfo(): void {
  const { name, reason } = effectiveMethod();
  const info = $('method-info');
  const chosen = $<HTMLSelectElement>('method').value;
  if (chosen === 'auto') {
    info.textContent = name ? `Auto picks ${name}. ${reason ?? ''}` : 'Auto picks a method once the source and target are chosen.';
  } else {
    info.textContent = getMethod(chosen).summary;
  }
  renderSettings(name || (chosen === 'auto' ? '' : chosen));
  updateFormula();
}

function specsFor(method: string): SettingSpec[] {
  if (!method) return [];
  const specs = [...settingSpecs(getMethod(method))];
  if (!hasOwnTimeBudget(method)) specs.push(ENFORCED_TIME_BUDGET);
  return specs;
}

let settingsFor = '';
function renderSettings(method: string): void {
  if (method === settingsFor) return;
  settingsFor = method;
  const box = $('settings');
  box.replaceChildren();
  const specs = specsFor(method);
  if (specs.length === 0) {
    const p = document.createElement('p');
    p.className = 'hint';
    p.textContent = 'Choose the data first: the settings depend on the method.';
    box.append(p);
  }
  for (const s of specs) {
    const wrap = document.createElement('div');
    wrap.className = 'setting field';
    const id = `setting-${s.name}`;
    const label = document.createElement('label');
    label.htmlFor = id;
    label.textContent = s.name;
    let input: HTMLInputElement | HTMLSelectElement;
    if (s.type === 'choice' || s.type === 'boolean') {
      const sel = document.createElement('select');
      for (const c of s.type === 'boolean' ? ['TRUE', 'FALSE'] : (s.choices ?? [])) {
        const o = document.createElement('option');
        o.value = c;
        o.textContent = c === defaultText(s) ? `${c} (default)` : c;
        sel.append(o);
      }
      sel.value = entered[s.name] || defaultText(s);
      input = sel;
    } else {
      const inp = document.createElement('input');
      inp.type = 'text';
      inp.inputMode = 'decimal';
      inp.placeholder = `default ${defaultText(s)}`;
      inp.value = entered[s.name] ?? '';
      input = inp;
    }
    input.id = id;
    const desc = document.createElement('p');
    desc.className = 'desc';
    desc.id = `${id}-desc`;
    desc.textContent = `${s.describe} Default: ${defaultText(s)}.`;
    input.setAttribute('aria-describedby', desc.id);
    input.addEventListener('change', () => {
      entered[s.name] = input.value;
      updateFormula();
    });
    input.addEventListener('input', () => {
      entered[s.name] = input.value;
      updateFormula();
    });
    wrap.append(label, input, desc);
    box.append(wrap);
  }
}

function currentSettingsText(): string {
  return settingsText(specsFor(settingsFor), entered);
}

function updateFormula(): void {
  const text = currentSettingsText();
  $('settings-summary').textContent = text ? `(${text})` : '(defaults)';
  try {
    $('formula-preview').textContent = `${fitFormula(formulaParts())}`;
  } catch {
    $('formula-preview').textContent = '';
  }
}

function formulaParts() {
  const v = (id: string) => $<HTMLInputElement>(id).value.trim();
  return { source: v('source'), target: v('target'), method: $<HTMLSelectElement>('method').value, settings: currentSettingsText(), sourceWeights: v('source-weights'), targetWeights: v('target-weights') };
}

/* ---------------- fitting ---------------- */

interface ProgressView {
  reset(title: string, budgetMs: number, cancellable: boolean): void;
  update(p: Progress): void;
  hide(): void;
}

function progressView(): ProgressView {
  let points: [number, number][] = [];
  let budget = Infinity;
  const started = { at: 0 };
  return {
    reset(title, budgetMs, cancellable) {
      points = [];
      budget = budgetMs;
      started.at = Date.now();
      $('progress-title').textContent = title;
      $<HTMLProgressElement>('progress-bar').removeAttribute('value');
      $('progress-text').textContent = 'Starting\u2026';
      $('loss-curve').innerHTML = '';
      $('cancel').hidden = !cancellable;
      $('progress-box').hidden = false;
    },
    update(p) {
      const bar = $<HTMLProgressElement>('progress-bar');
      if (p.of > 0) {
        bar.max = p.of;
        bar.value = Math.min(p.step, p.of);
      }
      if (Number.isFinite(p.loss)) {
        points.push([p.step, p.loss]);
        if (points.length > 400) points = points.filter((_, i) => i % 2 === 0);
      }
      const left = timeLeftMs(p.step, p.of, p.elapsedMs, budget);
      const lossText = Number.isFinite(p.loss) ? ` \u00b7 loss ${num(p.loss)}` : '';
      $('progress-text').textContent =
        `Step ${p.step.toLocaleString('en-US')} of ${p.of.toLocaleString('en-US')}${lossText} \u00b7 ${durationText(p.elapsedMs)} elapsed` +
        (left !== null && points.length >= 2 ? ` \u00b7 about ${durationText(left)} left` : '') +
        (p.message ? ` \u00b7 ${p.message}` : '');
      $('loss-curve').innerHTML = lossCurve(points, PLOT_WIDTH, 64);
    },
    hide() {
      $('progress-box').hidden = true;
    },
  };
}
const progress = progressView();

function budgetMsFor(method: string): number {
  const b = Number(entered.time_budget);
  const spec = specsFor(method).find((s) => s.name === 'time_budget');
  const secs = Number.isFinite(b) && b > 0 ? b : Number(spec?.default ?? Infinity);
  return secs * 1000;
}

async function fit(): Promise<void> {
  if (running) return;
  const parts = formulaParts();
  const cell = $<HTMLInputElement>('result-cell').value.trim();
  let formula: string;
  try {
    formula = fitFormula(parts);
    if (!cell) throw new Error('Choose the cell for the result (where the REMAP.FIT formula goes).');
  } catch (e) {
    setStatus(messageOf(e), true);
    return;
  }
  const fitButton = $<HTMLButtonElement>('fit');
  fitButton.disabled = true;
  setStatus('Reading the ranges\u2026');
  try {
    const [source, target, sw, tw] = await Promise.all(RANGE_INPUTS.map((id) => cellsOf(id)));
    const method = effectiveMethod().name || parts.method;
    progress.reset(`Fitting ${method}\u2026`, budgetMsFor(method), true);
    setStatus('');
    running = runner.start({ source: source ?? [], target: target ?? [], method: parts.method, settings: parts.settings, sourceWeights: sw, targetWeights: tw }, (p) => progress.update(p));
    const done = await running.done;
    running = null;
    progress.update({ step: done.diagnostics.convergence?.iterations ?? 1, of: done.diagnostics.convergence?.iterations ?? 1, loss: NaN, elapsedMs: done.elapsedMs, message: 'done' });
    setStatus('Keeping the map in the workbook\u2026');
    const map = restoreMap(parseMapJSON(done.json));
    await rememberAndKeep(done.handle, map, { cell });
    const written = await writeFormula(run, cell, formula);
    $<HTMLInputElement>('apply-model').value = written;
    progress.hide();
    showResults(done.handle, done.diagnostics, done, done.reason);
    setStatus(`Fitted in ${durationText(done.elapsedMs)}; ${written} holds the formula and the map's handle.`);
    void refreshMaps();
  } catch (e) {
    running = null;
    progress.hide();
    if (isRemapError(e) && e.kind === 'cancelled') setStatus('Fit cancelled. Nothing was written to the workbook; change the data or settings and press Fit again.');
    else setStatus(messageOf(e), true);
  } finally {
    fitButton.disabled = false;
  }
}

function cancel(): void {
  running?.cancel();
}

/* ---------------- results ---------------- */

function showResults(handle: string, diag: Diagnostics, data: PlotData | null, reason: string | null): void {
  $('results').hidden = false;
  $('result-handle').textContent = handle;
  const list = $('diagnostics');
  const lines = diagnosticsInWords(diag);
  if (reason) lines.splice(1, 0, `Why this method: ${reason}`);
  list.replaceChildren(...lines.map((t) => Object.assign(document.createElement('li'), { textContent: t })));
  const warnings = warningsInWords(diag.warnings);
  const wl = $('warnings');
  if (warnings.length === 0) {
    wl.replaceChildren(Object.assign(document.createElement('li'), { className: 'none', textContent: 'No warnings.' }));
  } else {
    wl.replaceChildren(
      ...warnings.map((w) => {
        const li = document.createElement('li');
        const title = document.createElement('strong');
        title.textContent = `${w.title}: `;
        const what = document.createElement('span');
        what.className = 'what';
        what.textContent = `What to do: ${w.action}`;
        li.append(title, w.text, what);
        return li;
      }),
    );
  }
  shown = data ? { ...data, handle } : null;
  $('plots-box').hidden = !data;
  if (!data) {
    const li = document.createElement('li');
    li.textContent = 'Plots are drawn for fits run from this pane; press Fit to see them.';
    list.append(li);
    return;
  }
  const d = data.source.d;
  const fill = (id: string, selected: number) => {
    const sel = $<HTMLSelectElement>(id);
    sel.replaceChildren(...Array.from({ length: d }, (_, k) => Object.assign(document.createElement('option'), { value: String(k), textContent: columnName(data, k) })));
    sel.value = String(Math.min(selected, d - 1));
  };
  fill('plot-column', 0);
  fill('scatter-x', 0);
  fill('scatter-y', 1);
  $('scatter-box').hidden = d < 2;
  drawPlots();
}

function drawPlots(): void {
  if (!shown) return;
  const k = Number($<HTMLSelectElement>('plot-column').value) || 0;
  const kind = $<HTMLSelectElement>('plot-kind').value === 'histogram' ? 'histogram' : 'ecdf';
  try {
    $('plot-dist').innerHTML = distributionSvg(shown, k, kind, PLOT_WIDTH);
    $('plot-qq').innerHTML = qqSvg(shown, k, PLOT_WIDTH);
    if (shown.source.d >= 2) {
      $('plot-scatter').innerHTML = scatterSvg(shown, Number($<HTMLSelectElement>('scatter-x').value), Number($<HTMLSelectElement>('scatter-y').value), PLOT_WIDTH);
    }
  } catch (e) {
    setStatus(`Could not draw the plots: ${messageOf(e)}`, true);
  }
}

async function insertChart(): Promise<void> {
  if (!shown) return;
  const k = Number($<HTMLSelectElement>('plot-column').value) || 0;
  try {
    const name = await insertComparisonChart(run, chartTable(shown, k));
    setStatus(`Inserted a chart of ${columnName(shown, k)} on the new sheet "${name}".`);
  } catch (e) {
    setStatus(`Could not insert the chart: ${messageOf(e)}`, true);
  }
}

/* ---------------- apply ---------------- */

async function writeApply(): Promise<void> {
  const v = (id: string) => $<HTMLInputElement>(id).value.trim();
  try {
    const formula = applyFormula(v('apply-model'), v('apply-values'), $<HTMLSelectElement>('apply-direction').value === 'invert' ? 'invert' : 'apply');
    if (!v('apply-out')) throw new Error('Choose the cell where the results start.');
    const at = await writeFormula(run, v('apply-out'), formula);
    setStatus(`Wrote ${formula} in ${at}.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
}

/* ---------------- maps in the workbook ---------------- */

async function refreshMaps(): Promise<void> {
  const ul = $('maps');
  try {
    const maps = await store.list();
    if (maps.length === 0) {
      ul.replaceChildren(Object.assign(document.createElement('li'), { className: 'muted', textContent: 'No maps are kept in this workbook yet.' }));
      return;
    }
    ul.replaceChildren(...maps.map(mapItem));
  } catch (e) {
    ul.replaceChildren(Object.assign(document.createElement('li'), { className: 'muted', textContent: `Could not read the maps: ${messageOf(e)}` }));
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
  meta.textContent = `cost ${num(m.cost)} \u00b7 ${date && !Number.isNaN(date.getTime()) ? date.toLocaleString() : 'date unknown'}${m.cell ? ` \u00b7 ${m.cell}` : ''} \u00b7 ${(m.chars / 1000).toFixed(1)} k characters`;
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
    const json = await store.load(m.handle);
    if (!json) throw new Error(`The map ${m.handle} is no longer in this workbook.`);
    const map = restoreMap(parseMapJSON(json));
    showResults(m.handle, map.diagnostics(), null, null);
    if (m.cell) void selectRange(run, m.cell).catch(() => undefined);
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
    await store.remove(m.handle);
    progress.reset(`Fitting ${m.method} in ${m.cell}\u2026`, budgetMsFor(m.method), false);
    const stop = watchFits((h, p) => (h === m.handle ? progress.update(p) : undefined));
    const formula = await reenterFormula(run, m.cell);
    if (!formula) throw new Error(`${m.cell} no longer holds a formula; choose the ranges above and press Fit.`);
    setStatus(`Fitting again in ${m.cell}; the cell shows its progress, and clearing it cancels the fit.`);
    setTimeout(() => {
      stop();
      progress.hide();
      void refreshMaps();
    }, 1500);
  } catch (e) {
    progress.hide();
    setStatus(messageOf(e), true);
  }
}

async function exportJson(m: KeptMap): Promise<void> {
  try {
    const json = await store.load(m.handle);
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
    await store.remove(m.handle);
    setStatus(`Deleted the map ${m.handle} from this workbook. A REMAP.FIT cell that makes it will fit and keep it again when recalculated.`);
  } catch (e) {
    setStatus(messageOf(e), true);
  }
  void refreshMaps();
}

/* ---------------- the function list ---------------- */

async function showFunctions(): Promise<void> {
  const list = $('function-list');
  try {
    const response = await fetch('functions.json', { cache: 'no-cache' });
    if (!response.ok) throw new Error(`HTTP ${response.status}`);
    const functions = listedFunctions(await response.json());
    list.replaceChildren(
      ...functions.map((f) => {
        const item = document.createElement('li');
        const code = document.createElement('code');
        code.textContent = `REMAP.${f.name}`;
        item.append(code);
        if (f.description) item.append(` \u2014 ${f.description}`);
        return item;
      }),
    );
  } catch (e) {
    list.replaceChildren(Object.assign(document.createElement('li'), { className: 'muted', textContent: `Could not read the function list (${messageOf(e)}).` }));
  }
}

/* ---------------- start ---------------- */

function start(): void {
  run = officeRun();
  store = workbookKeeper();
  const method = $<HTMLSelectElement>('method');
  const opt = (value: string, text: string) => Object.assign(document.createElement('option'), { value, textContent: text });
  method.replaceChildren(opt('auto', 'auto (choose for me)'), ...listMethods().map((m) => opt(m.name, m.name)));
  method.value = 'auto';
  method.addEventListener('change', updateMethodInfo);

  const pickers: [string, string][] = [
    ['source-pick', 'source'],
    ['target-pick', 'target'],
    ['source-weights-pick', 'source-weights'],
    ['target-weights-pick', 'target-weights'],
    ['result-pick', 'result-cell'],
    ['apply-model-pick', 'apply-model'],
    ['apply-values-pick', 'apply-values'],
    ['apply-out-pick', 'apply-out'],
  ];
  for (const [button, input] of pickers) $(button).addEventListener('click', () => void pickInto(input));
  $('source').addEventListener('change', () => void describeSample('source'));
  $('target').addEventListener('change', () => void describeSample('target'));
  for (const id of ['source-weights', 'target-weights', 'result-cell']) $(id).addEventListener('change', updateFormula);
  $('fit').addEventListener('click', () => void fit());
  $('cancel').addEventListener('click', cancel);
  for (const id of ['plot-column', 'plot-kind', 'scatter-x', 'scatter-y']) $(id).addEventListener('change', drawPlots);
  $('insert-chart').addEventListener('click', () => void insertChart());
  $('apply').addEventListener('click', () => void writeApply());
  $('maps-refresh').addEventListener('click', () => void refreshMaps());
  updateMethodInfo();
  void refreshMaps();
  void showFunctions();
}

// In Excel, wait for Office to be ready; opened in a plain browser (no office.js), the pane says so.
if (typeof Office !== 'undefined' && typeof Office.onReady === 'function') {
  void Office.onReady(() => start());
} else if (typeof document !== 'undefined') {
  document.addEventListener('DOMContentLoaded', () => {
    const s = document.getElementById('status');
    if (s) s.textContent = 'Open this pane inside Excel: Office.js is not loaded here.';
    void showFunctions();
  });
}
