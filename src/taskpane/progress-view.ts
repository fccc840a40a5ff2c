import type { Progress } from '../engine/map';
import { $, announce, PLOT_WIDTH } from './dom';
import { lossCurve } from './loss-curve';
import { pane } from './pane-state';
import { num } from './plain-words';
import { durationText, timeLeftMs } from './time-left';

/* The progress area of section 3: a bar, the step and loss, a loss curve, elapsed time and time left. */

/** Shows the progress area for a new fit (Cancel only when the pane can stop the fit). */
export function resetProgress(title: string, budgetMs: number, cancellable: boolean): void {
  pane.progress = { points: [], budgetMs, milestone: 0 };
  announce(`${title} Progress is announced at each quarter.`);
  $('progress-title').textContent = title;
  $<HTMLProgressElement>('progress-bar').removeAttribute('value');
  $('progress-text').textContent = 'Starting\u2026';
  $('loss-curve').innerHTML = '';
  $('cancel').hidden = !cancellable;
  $('progress-box').hidden = false;
}

/** Shows one progress report. */
export function updateProgress(p: Progress): void {
  const bar = $<HTMLProgressElement>('progress-bar');
  if (p.of > 0) {
    bar.max = p.of;
    bar.value = Math.min(p.step, p.of);
  }
  const prog = pane.progress;
  if (Number.isFinite(p.loss)) {
    prog.points.push([p.step, p.loss]);
    if (prog.points.length > 400) prog.points = prog.points.filter((_, i) => i % 2 === 0);
  }
  const points = prog.points;
  const left = timeLeftMs(p.step, p.of, p.elapsedMs, prog.budgetMs);
  const lossText = Number.isFinite(p.loss) ? ` \u00b7 loss ${num(p.loss)}` : '';
  $('progress-text').textContent =
    `Step ${p.step.toLocaleString('en-US')} of ${p.of.toLocaleString('en-US')}${lossText} \u00b7 ${durationText(p.elapsedMs)} elapsed` +
    (left !== null && points.length >= 2 ? ` \u00b7 about ${durationText(left)} left` : '') +
    (p.message ? ` \u00b7 ${p.message}` : '');
  $('loss-curve').innerHTML = lossCurve(points, PLOT_WIDTH, 64);
  // Screen readers hear milestones only (each quarter, and the end), not every report.
  const quarter = p.of > 0 ? Math.min(4, Math.floor((4 * Math.min(p.step, p.of)) / p.of)) : 0;
  if (quarter > prog.milestone) {
    prog.milestone = quarter;
    announce(quarter === 4 ? `Fit finished: step ${p.step} of ${p.of}.` : `Fit ${25 * quarter}% done: step ${p.step} of ${p.of}.`);
  }
}

/** Hides the progress area. */
export function hideProgress(): void {
  $('progress-box').hidden = true;
}
