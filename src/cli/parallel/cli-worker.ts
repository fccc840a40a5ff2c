import { parentPort } from 'worker_threads';
import type { TransportMap } from '../../engine/map';
import { parseMapJSON } from '../../engine/map-json';
import { restoreMap } from '../../engine/methods';
import { scanNumericBytes } from '../numeric-csv';
import { mapTable } from '../numeric-map-file';
import type { MappedPiece, WorkerReply, WorkerTask } from './messages';

/**
 * A worker thread of the `remap` command (WorkerPool starts it): reads pieces of CSV files, and maps pieces with a
 * saved map, exactly as the command reads and maps a whole file on one thread. Results go back with their buffers
 * transferred, not copied.
 */
let model = '';
let map: TransportMap | null = null;

function mapped(task: Extract<WorkerTask, { kind: 'map' }>): MappedPiece | null {
  if (map === null || task.model !== model) {
    map?.dispose();
    map = restoreMap(parseMapJSON(task.model));
    model = task.model;
  }
  const table = scanNumericBytes(task.bytes, task.name, task.dialect, task.rows);
  if (table === null || (!task.last && table.lines !== table.rows)) return null;
  const fast = mapTable(table, map, task.direction, task.header);
  if (fast === null) return null;
  const pieces: Uint8Array[] = [];
  fast.write((chunk) => pieces.push(chunk));
  return { pieces, n: fast.mapped.n, outside: fast.mapped.outside };
}

parentPort!.on('message', (task: WorkerTask) => {
  let reply: WorkerReply;
  const transfer: ArrayBuffer[] = [];
  try {
    if (task.kind === 'scan') {
      const table = scanNumericBytes(task.bytes, task.name, task.dialect, task.rows);
      if (table) for (const a of [...table.values, ...table.kinds]) transfer.push(a.buffer as ArrayBuffer);
      reply = { kind: 'scan', table };
    } else {
      const result = mapped(task);
      if (result) for (const p of result.pieces) transfer.push(p.buffer as ArrayBuffer);
      reply = { kind: 'map', result };
    }
  } catch (e) {
    reply = { kind: 'error', message: String((e as Error)?.message ?? e) };
    transfer.length = 0;
  }
  parentPort!.postMessage(reply, transfer);
});
