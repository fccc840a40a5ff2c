import type { ReadSample } from '../input';
import type { ExcelRun } from '../workbook/excel-run';
import type { WorkbookMapStore } from '../workbook/map-store';
import type { PlotData } from './plots-view';
import { FitRunner, type RunningFit } from './fit-runner';

/**
 * Everything the pane remembers between events, in one place. Each section
 * (data, method, fit, results, apply, maps, formulas, functions) reads and
 * writes these fields and nothing else of the others'.
 */
export interface PaneState {
  /** Office.js access (Excel.run, or a test's fake). Set at start. */
  run: ExcelRun;
  /** The workbook's map store. Set at start. */
  store: WorkbookMapStore;
  /** Runs the pane's fits off the page's thread. */
  readonly runner: FitRunner;
  /** The fit in progress, or null. */
  running: RunningFit | null;
  /** The fit whose plots are shown, or null. */
  shown: (PlotData & { handle: string }) | null;
  /** Settings the user typed, by name (text as entered). */
  readonly entered: Record<string, string>;
  /** The source and target read so far (for the auto choice and the info lines). */
  readonly samples: Record<'source' | 'target', ReadSample | null>;
  /** The method whose settings are listed. */
  settingsFor: string;
  /** The loss curve drawn so far ([step, loss]) and the running fit's time budget (ms), for the progress area. */
  progress: { points: [number, number][]; budgetMs: number; milestone: number };
}

export const pane: PaneState = {
  run: undefined as unknown as ExcelRun,
  store: undefined as unknown as WorkbookMapStore,
  runner: new FitRunner(),
  running: null,
  shown: null,
  entered: {},
  samples: { source: null, target: null },
  settingsFor: '',
  progress: { points: [], budgetMs: Infinity, milestone: 0 },
};
