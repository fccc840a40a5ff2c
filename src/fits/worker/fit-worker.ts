/* The fit worker: runs fits off the page's thread, for the pane (cells in, map
 * and plot data out) and for worksheet cells (samples in, map out), so the page
 * keeps drawing and Excel's cells stay responsive. Ending the worker stops any
 * method at once. Same engine, same input rules and same handles as on the page.
 * It tells the wasm tensor backend where its binaries are served (wasm/, next
 * to the page), so trained fits run on wasm here. */
import { configureBackend } from '../../engine/gradient-net/backend';
import { runFitJob } from './cells-job';
import { MapJobs } from './map-job';
import type { FitReply, WorkerRequest } from './messages';
import { runSampleFit } from './samples-job';

const scope = self as unknown as {
  postMessage(m: FitReply, transfer?: Transferable[]): void;
  onmessage: ((ev: MessageEvent<WorkerRequest>) => void) | null;
  location: Location;
};

try {
  configureBackend({ wasmPath: new URL('wasm/', scope.location.href).href });
} catch {
  /* the cpu backend still works */
}

function fail(id: number, e: unknown): void {
  const err = e as { message?: string; kind?: string };
  scope.postMessage({ type: 'error', id, message: String(err?.message ?? e), kind: String(err?.kind ?? 'value') });
}

/** Rows mapped off the page (worker-mapper.ts): the last map read is kept for the next piece. */
const mapJobs = new MapJobs();

scope.onmessage = (ev: MessageEvent<WorkerRequest>) => {
  const req = ev.data;
  if (!req) return;
  if (req.type === 'map-points') {
    try {
      const done = mapJobs.run(req);
      scope.postMessage(done, [done.data.buffer]);
    } catch (e) {
      fail(req.id, e);
    }
    return;
  }
  if (req.type === 'fit-samples') {
    runSampleFit(req, (progress) => scope.postMessage({ type: 'progress', id: req.id, progress })).then(
      (json) => scope.postMessage({ type: 'map', id: req.id, json }),
      (e: unknown) => fail(req.id, e),
    );
    return;
  }
  if (req.type !== 'fit') return;
  runFitJob(req, (progress) => scope.postMessage({ type: 'progress', id: req.id, progress })).then(
    (done) => scope.postMessage(done, [done.source.data.buffer, done.mapped.data.buffer, done.target.data.buffer]),
    (e: unknown) => fail(req.id, e),
  );
};
