/* The fit service: reading a fit's cells into inputs and a handle, fitting
 * (or finding) the map under time budgets with progress, the session's maps by
 * handle and the keeper that outlasts the session, streaming a fit into a cell,
 * and a map's report as a table. Every door (worksheet functions, the pane, the
 * headless demo, the command line) uses it; it imports only the engine and input. */
export { type MaybePromise, then } from './maybe-promise';
export { makeHandle, isHandle, PROGRESS_PREFIX, isProgressText } from './handles';
export { type Keeper, type KeptInfo, setKeeper, currentKeeper } from './keeper';
export { remember, rememberAndKeep, recall, forget, forgetAll, recallOrFit, running, resolveMap } from './store';
export { DEFAULT_TIME_BUDGET_SECONDS, ENFORCED_TIME_BUDGET, hasOwnTimeBudget, splitBudget, budgetError } from './time-budget';
export { type FitInputs, type FitCells, readFit } from './read-fit';
export { watchFits } from './watchers';
export { type CellMap, cellKey, noteCellMap, cellMap } from './cell-maps';
export { type FitRun, type Fitter, setFitter, currentFitter, fitInThisThread, fitFromInputs } from './fit-service';
export { type StreamSink, STREAM_EVERY_MS, streamFit, progressText } from './stream-fit';
export { reportTable } from './report-table';
export { groupedWarnings } from './grouped-warnings';
export { type Mapper, mapInThisThread, setMapper, mapPoints } from './map-service';
