/* The pane's fit worker: runs one fit at a time off the page's thread, so the
 * pane keeps drawing progress and Cancel (which ends this worker) stops any
 * method at once. Same engine, same coercion and same handle as REMAP.FIT. */
import { configureBackend } from '../engine/gradient-net/backend';
import type { FitReply, FitRequest } from './fit-messages';
import { runFitJob } from './fit-job';

const scope = self as unknown as { postMessage(m: FitReply, transfer?: Transferable[]): void; onmessage: ((ev: MessageEvent<FitRequest>) => void) | null; location: Location };

try {
  configureBackend({ wasmPath: new URL('wasm/', scope.location.href).href });
} catch {
  /* the cpu backend still works */
}

scope.onmessage = (ev: MessageEvent<FitRequest>) => {
  const req = ev.data;
  if (!req || req.type !== 'fit') return;
  runFitJob(req, (progress) => scope.postMessage({ type: 'progress', id: req.id, progress })).then(
    (done) => scope.postMessage(done, [done.source.data.buffer, done.mapped.data.buffer, done.target.data.buffer]),
    (e: unknown) => {
      const err = e as { message?: string; kind?: string };
      scope.postMessage({ type: 'error', id: req.id, message: String(err?.message ?? e), kind: String(err?.kind ?? 'value') });
    },
  );
};
