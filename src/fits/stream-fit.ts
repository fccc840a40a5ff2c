import type { Progress, TransportMap } from '../engine/map';
import { fitFromInputs } from './fit-service';
import { PROGRESS_PREFIX } from './handles';
import type { MaybePromise } from './maybe-promise';
import type { FitInputs } from './read-fit';
import { recall, running } from './store';
import { watchFits } from './watchers';

/**
 * What a streaming cell offers (Excel's CustomFunctions.StreamingInvocation):
 * a result setter, a cancel hook the host calls when the inputs change or the
 * cell is cleared, and the cell's address when the function asks for it.
 */
export interface StreamSink {
  setResult(value: unknown): void;
  onCanceled?: () => void;
  readonly address?: string;
}

/** Fewest milliseconds between two progress texts in a cell (each one recalculates the cells that depend on it). */
export const STREAM_EVERY_MS = 1000;

/**
 * A fit whose progress streams into a cell: "fitting <method>: step s/n" while
 * a background fit trains, then the handle; a synchronous fit (or a map already
 * fitted) gives the handle at once. The host's cancel (inputs changed, cell
 * cleared) aborts the fit through its signal. Errors go to the cell through
 * `toError` (the door's error maker). A fit shared with another cell that was
 * cancelled there is started again here, once (fitFromInputs does it).
 * Cost: that of the fit, plus O(1) per progress report.
 */
export function streamFit(read: () => FitInputs, sink: StreamSink, toError: (e: unknown) => unknown): void {
  const abort = { aborted: false };
  sink.onCanceled = () => {
    abort.aborted = true;
  };
  let inputs: FitInputs;
  try {
    inputs = read();
  } catch (e) {
    sink.setResult(toError(e));
    return;
  }
  let last = -Infinity;
  const show = (p: Progress): void => {
    const now = Date.now();
    if (abort.aborted || now - last < STREAM_EVERY_MS) return;
    last = now;
    sink.setResult(progressText(inputs.method, p));
  };
  // Joined to a fit another cell started: show its progress here too.
  const joined = recall(inputs.handle) === undefined && running(inputs.handle) !== undefined;
  const stop = joined ? watchFits((h, p) => (h === inputs.handle ? show(p) : undefined)) : null;
  let r: MaybePromise<TransportMap>;
  try {
    r = fitFromInputs(inputs, { signal: abort, onProgress: show, cell: sink.address });
  } catch (e) {
    stop?.();
    if (!abort.aborted) sink.setResult(toError(e));
    return;
  }
  if (!(r instanceof Promise)) {
    sink.setResult(inputs.handle);
    return;
  }
  sink.setResult(`${PROGRESS_PREFIX}${inputs.method}: starting`);
  r.then(
    () => {
      stop?.();
      if (!abort.aborted) sink.setResult(inputs.handle);
    },
    (e) => {
      stop?.();
      if (!abort.aborted) sink.setResult(toError(e));
    },
  );
}

/**
 * A progress report in a few words, as a streaming cell shows it.
 * O(1).
 * @example progressText('gradient-net', { step: 120, of: 1500, loss: 0.01, elapsedMs: 9000 }) // 'fitting gradient-net: step 120/1500 (9 s)'
 */
export function progressText(method: string, p: Progress): string {
  const secs = Math.round(p.elapsedMs / 1000);
  return `${PROGRESS_PREFIX}${method}: step ${p.step}/${p.of} (${secs} s)`;
}
