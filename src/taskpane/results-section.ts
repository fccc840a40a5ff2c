import type { Diagnostics } from '../engine/map';
import { insertComparisonChart } from '../workbook/comparison-chart';
import { $, listItem, messageOf, PLOT_WIDTH, setStatus } from './dom';
import { pane } from './pane-state';
import { shownBand } from './bounds-view';
import { noWarningsLine } from './formula-status';
import { diagnosticsInWords, warningsInWords } from './plain-words';
import { chartTable, columnName, distributionSvg, qqSvg, scatterSvg, type PlotData } from './plots-view';
import { hideGroups } from './groups-view';

/* Section 4, What the fit says: diagnostics and warnings in words, plots, and a native chart on request. */

/** Shows a map's diagnostics and warnings, and its plots when the pane has the fit's data. */
export function showResults(handle: string, diag: Diagnostics, data: PlotData | null, reason: string | null): void {
  $('results').hidden = false;
  hideGroups();
  $('result-handle').textContent = handle;
  const list = $('diagnostics');
  const lines = diagnosticsInWords(diag);
  if (reason) lines.splice(1, 0, `Why this method: ${reason}`);
  list.replaceChildren(...lines.map((t) => listItem(t)));
  const warnings = warningsInWords(diag.warnings);
  const wl = $('warnings');
  if (warnings.length === 0) {
    wl.replaceChildren(listItem(noWarningsLine(diag.reminder), 'none'));
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
      // Shown with warnings too: fixing every warning does not make the map validated.
      listItem(diag.reminder, 'none'),
    );
  }
  pane.shown = data ? { ...data, handle } : null;
  $('plots-box').hidden = !data;
  if (!data) {
    list.append(listItem('Plots are drawn for fits run from this pane; press Fit to see them.'));
    return;
  }
  const d = data.source.d;
  const fill = (id: string, selected: number) => {
    const sel = $<HTMLSelectElement>(id);
    sel.replaceChildren(
      ...Array.from({ length: d }, (_, k) => Object.assign(document.createElement('option'), { value: String(k), textContent: columnName(data, k) })),
    );
    sel.value = String(Math.min(selected, d - 1));
  };
  fill('plot-column', 0);
  fill('scatter-x', 0);
  fill('scatter-y', 1);
  $('scatter-box').hidden = d < 2;
  drawPlots();
}

/** Draws the plots for the chosen column (and scatter columns). */
export function drawPlots(): void {
  const shown = pane.shown;
  if (!shown) return;
  const k = Number($<HTMLSelectElement>('plot-column').value) || 0;
  const kind = $<HTMLSelectElement>('plot-kind').value === 'histogram' ? 'histogram' : 'ecdf';
  try {
    $('plot-dist').innerHTML = distributionSvg(shown, k, kind, PLOT_WIDTH);
    $('plot-qq').innerHTML = qqSvg(shown, k, PLOT_WIDTH, shownBand(shown));
    if (shown.source.d >= 2) {
      const x = Number($<HTMLSelectElement>('scatter-x').value);
      const y = Number($<HTMLSelectElement>('scatter-y').value);
      $('plot-scatter').innerHTML = scatterSvg(shown, x, y, PLOT_WIDTH);
    }
  } catch (e) {
    setStatus(`Could not draw the plots: ${messageOf(e)}`, true);
  }
}

/** Inserts a native Excel chart of the chosen column on a new sheet. */
export async function insertChart(): Promise<void> {
  const shown = pane.shown;
  if (!shown) return;
  const k = Number($<HTMLSelectElement>('plot-column').value) || 0;
  try {
    const name = await insertComparisonChart(pane.run, chartTable(shown, k));
    setStatus(`Inserted a chart of ${columnName(shown, k)} on the new sheet "${name}".`);
  } catch (e) {
    setStatus(`Could not insert the chart: ${messageOf(e)}`, true);
  }
}
