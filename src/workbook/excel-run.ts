/**
 * How the workbook layer reaches Excel: one function that runs a batch of
 * Office.js requests, like Excel.run. Everything in src/workbook takes one, so
 * tests hand in a fake workbook and the add-in hands in the real Excel.run.
 */

/** Runs `batch` against a request context and returns what it returns (Excel.run's shape). */
export type ExcelRun = <T>(batch: (context: Excel.RequestContext) => Promise<T>) => Promise<T>;

let ready: Promise<unknown> | null = null;

/**
 * The real Excel.run, waiting once for Office.onReady first (the functions
 * runtime may call before Office has finished starting).
 * @throws Error when Office.js is not loaded (outside Excel).
 * @example await officeRun()(async (context) => { context.workbook.getSelectedRange().load('address'); await context.sync(); })
 */
export function officeRun(): ExcelRun {
  return async <T>(batch: (context: Excel.RequestContext) => Promise<T>): Promise<T> => {
    if (typeof Excel === 'undefined' || typeof Excel.run !== 'function') {
      throw new Error('Remap: Excel is not available here; open the add-in inside Excel.');
    }
    if (!ready) ready = typeof Office !== 'undefined' && typeof Office.onReady === 'function' ? Office.onReady() : Promise.resolve();
    await ready;
    return Excel.run(batch);
  };
}
