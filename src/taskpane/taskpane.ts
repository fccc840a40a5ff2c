/**
 * The Remap pane: pick source and target ranges, a method and its settings,
 * fit with progress (step, loss, time left, Cancel), read the fit's
 * diagnostics, warnings and plots, insert a native chart, write APPLY
 * formulas, and manage the maps kept in the workbook.
 *
 * One file per section (data-, method-, fit-, results-, apply-, maps-,
 * formulas-, functions-section.ts); what they remember between events lives in
 * pane-state.ts. This file only wires the page's controls to them at start.
 *
 * How a fit runs: the pane reads the cells, runs the fit in a Web Worker
 * (fit-runner.ts) through the same input room and fit service as REMAP.FIT,
 * keeps the map (in this runtime's store and in the workbook), and only then
 * writes `=REMAP.FIT(...)` into the chosen cell. The formula derives the same
 * handle from the same cells and finds the map at once, so the workbook stays
 * the record and nothing is fitted twice. UI only: every Office call is in src/workbook.
 */
import { listMethods } from '../engine/methods';
import { officeRun } from '../workbook/excel-run';
import { workbookKeeper } from '../workbook/keeper';
import { missingRequirements, officeRequirements } from '../workbook/requirements';
import { writeApply } from './apply-section';
import { describeSample, pickInto } from './data-section';
import { $, setStatus } from './dom';
import { cancel, fit } from './fit-section';
import { showFunctions } from './functions-section';
import { refreshFormulas } from './formulas-section';
import { refreshMaps } from './maps-section';
import { updateFormula, updateMethodInfo } from './method-section';
import { pane } from './pane-state';
import { drawPlots, insertChart } from './results-section';
import { followOfficeTheme } from './theme';

export { listedFunctions } from './function-list';

/** Buttons that put the workbook's selection into an input: [button id, input id]. */
const PICKERS: readonly [string, string][] = [
  ['source-pick', 'source'],
  ['target-pick', 'target'],
  ['source-weights-pick', 'source-weights'],
  ['target-weights-pick', 'target-weights'],
  ['result-pick', 'result-cell'],
  ['apply-model-pick', 'apply-model'],
  ['apply-values-pick', 'apply-values'],
  ['apply-out-pick', 'apply-out'],
];

function start(): void {
  followOfficeTheme();
  pane.run = officeRun();
  pane.store = workbookKeeper();
  const method = $<HTMLSelectElement>('method');
  const opt = (value: string, text: string) => Object.assign(document.createElement('option'), { value, textContent: text });
  method.replaceChildren(opt('auto', 'auto (choose for me)'), ...listMethods().map((m) => opt(m.name, m.name)));
  method.value = 'auto';
  method.addEventListener('change', updateMethodInfo);

  for (const [button, input] of PICKERS) $(button).addEventListener('click', () => void pickInto(input));
  $('source').addEventListener('change', () => void describeSample('source'));
  $('target').addEventListener('change', () => void describeSample('target'));
  for (const id of ['source-weights', 'target-weights', 'result-cell']) $(id).addEventListener('change', updateFormula);
  $('fit').addEventListener('click', () => void fit());
  $('cancel').addEventListener('click', cancel);
  for (const id of ['plot-column', 'plot-kind', 'scatter-x', 'scatter-y']) $(id).addEventListener('change', drawPlots);
  $('insert-chart').addEventListener('click', () => void insertChart());
  $('apply').addEventListener('click', () => void writeApply());
  $('maps-refresh').addEventListener('click', () => void refreshMaps());
  $('formulas-refresh').addEventListener('click', () => void refreshFormulas());
  updateMethodInfo();
  void refreshMaps();
  void refreshFormulas();
  void showFunctions();
  const missing = missingRequirements(officeRequirements());
  if (missing.length > 0) {
    const what = missing.map((m) => `${m.name} ${m.version} (${m.why})`).join('; ');
    setStatus(`This version of Excel lacks what Remap needs: ${what}. Update Excel, or use Excel on the web.`, true);
  }
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
