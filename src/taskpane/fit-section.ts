import { isRemapError } from '../engine/errors';
import { parseMapJSON } from '../engine/map-json';
import { restoreMap } from '../engine/methods';
import { rememberAndKeep } from '../fits';
import { writeFormula } from '../workbook/ranges';
import { cellsOf, RANGE_INPUTS } from './data-section';
import { $, messageOf, setStatus } from './dom';
import { fitFormula } from './formula';
import { refreshFormulas } from './formulas-section';
import { refreshMaps } from './maps-section';
import { budgetMsFor, effectiveMethod, formulaParts } from './method-section';
import { pane } from './pane-state';
import { hideProgress, resetProgress, updateProgress } from './progress-view';
import { showResults } from './results-section';
import { durationText } from './time-left';

/* Section 3, Fit: reads the ranges, fits off the page's thread with progress, keeps the map, then writes REMAP.FIT. */

/**
 * Fits with the pane's inputs: the map is kept in memory and in the workbook
 * first, and only then is `=REMAP.FIT(...)` written, so the formula finds the
 * map under the same handle and nothing is fitted twice.
 */
export async function fit(): Promise<void> {
  if (pane.running) return;
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
    resetProgress(`Fitting ${method}\u2026`, budgetMsFor(method), true);
    setStatus('');
    const ask = { source: source ?? [], target: target ?? [], method: parts.method, settings: parts.settings, sourceWeights: sw, targetWeights: tw };
    pane.running = pane.runner.start(ask, updateProgress);
    const done = await pane.running.done;
    pane.running = null;
    const steps = done.diagnostics.convergence?.iterations ?? 1;
    updateProgress({ step: steps, of: steps, loss: NaN, elapsedMs: done.elapsedMs, message: 'done' });
    setStatus('Keeping the map in the workbook\u2026');
    const map = restoreMap(parseMapJSON(done.json));
    await rememberAndKeep(done.handle, map, { cell });
    const written = await writeFormula(pane.run, cell, formula);
    $<HTMLInputElement>('apply-model').value = written;
    hideProgress();
    showResults(done.handle, done.diagnostics, done, done.reason);
    setStatus(`Fitted in ${durationText(done.elapsedMs)}; ${written} holds the formula and the map's handle.`);
    void refreshMaps();
    void refreshFormulas();
  } catch (e) {
    pane.running = null;
    hideProgress();
    if (isRemapError(e) && e.kind === 'cancelled')
      setStatus('Fit cancelled. Nothing was written to the workbook; change the data or settings and press Fit again.');
    else setStatus(messageOf(e), true);
  } finally {
    fitButton.disabled = false;
  }
}

/** Stops the pane's fit. */
export function cancel(): void {
  pane.running?.cancel();
}
