import { officeRun } from './excel-run';
import { WorkbookMapStore } from './map-store';

let store: WorkbookMapStore | null = null;

/**
 * The one workbook map store of this runtime, over the real Excel.run: the
 * Keeper the worksheet functions use, and the list the pane shows. O(1).
 * @example setKeeper(workbookKeeper())
 */
export function workbookKeeper(): WorkbookMapStore {
  if (!store) store = new WorkbookMapStore(officeRun());
  return store;
}
