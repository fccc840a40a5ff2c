import { RemapError } from '../engine/errors';
import type { Progress } from '../engine/map';
import { runFitJob } from '../fits/worker/cells-job';
import { replyError, type FitDone, type FitReply, type FitRequest } from '../fits/worker/messages';

/** A fit the pane started: its result, and how to stop it. */
export interface RunningFit {
  readonly done: Promise<FitDone>;
  /** Stops the fit: in the worker at once (the worker is ended), on the page at the engine's next check. */
  cancel(): void;
}

/** The request without the fields the runner fills in. */
export type FitAsk = Omit<FitRequest, 'type' | 'id'>;

/**
 * Runs the pane's fits in a Web Worker (fit-worker.js, next to the page), one
 * at a time. Cancel ends the worker, so any method stops within a moment, even
 * a synchronous one in the middle of a long loop; the next fit starts a fresh
 * worker. Where workers are unavailable (or the worker script fails to load)
 * fits run on the page through the same code, cancelled through the engine's
 * signal (trained methods check it every few milliseconds).
 */
export class FitRunner {
  private worker: Worker | null = null;
  private nextId = 1;
  private useWorker: boolean;
  private readonly workerUrl: string;

  /** @param workerUrl the worker script (default "fit-worker.js", next to taskpane.html). */
  constructor(workerUrl = 'fit-worker.js') {
    this.workerUrl = workerUrl;
    this.useWorker = typeof Worker !== 'undefined';
  }

  /** True while fits run in a worker (false after falling back to the page). */
  get inWorker(): boolean {
    return this.useWorker;
  }

  /** Starts a fit; `onProgress` receives the engine's progress reports. */
  start(ask: FitAsk, onProgress: (p: Progress) => void): RunningFit {
    const req: FitRequest = { ...ask, type: 'fit', id: this.nextId++ };
    if (!this.useWorker) return this.onPage(req, onProgress);
    let worker: Worker;
    try {
      worker = this.worker ?? new Worker(this.workerUrl);
    } catch {
      this.useWorker = false;
      return this.onPage(req, onProgress);
    }
    this.worker = worker;
    let settle: { resolve(d: FitDone): void; reject(e: unknown): void } = { resolve: () => undefined, reject: () => undefined };
    let fallback: RunningFit | null = null;
    let finished = false;
    const done = new Promise<FitDone>((resolve, reject) => (settle = { resolve, reject }));
    const cleanup = () => {
      finished = true;
      worker.removeEventListener('message', onMessage);
      worker.removeEventListener('error', onError);
    };
    const onMessage = (ev: MessageEvent<FitReply>) => {
      const m = ev.data;
      if (!m || m.id !== req.id) return;
      if (m.type === 'progress') onProgress(m.progress);
      else if (m.type === 'done') {
        cleanup();
        settle.resolve(m);
      } else if (m.type === 'error') {
        cleanup();
        settle.reject(replyError(m));
      }
    };
    const onError = (ev: ErrorEvent) => {
      // The worker script could not load or crashed: run this fit on the page instead.
      ev.preventDefault?.();
      cleanup();
      this.worker?.terminate();
      this.worker = null;
      this.useWorker = false;
      fallback = this.onPage(req, onProgress);
      fallback.done.then(settle.resolve, settle.reject);
    };
    worker.addEventListener('message', onMessage);
    worker.addEventListener('error', onError);
    worker.postMessage(req);
    return {
      done,
      cancel: () => {
        if (fallback) return fallback.cancel();
        if (finished) return;
        cleanup();
        worker.terminate();
        if (this.worker === worker) this.worker = null;
        settle.reject(new RemapError('The fit was cancelled.', 'cancelled'));
      },
    };
  }

  private onPage(req: FitRequest, onProgress: (p: Progress) => void): RunningFit {
    const signal = { aborted: false };
    let rejectNow: (e: unknown) => void = () => undefined;
    const stopped = new Promise<never>((_, reject) => (rejectNow = reject));
    const job = new Promise<FitDone>((resolve, reject) => {
      // Let the page paint the progress area before a synchronous fit takes the thread.
      setTimeout(() => runFitJob(req, onProgress, signal).then(resolve, reject), 30);
    });
    return {
      done: Promise.race([job, stopped]),
      cancel: () => {
        signal.aborted = true;
        rejectNow(new RemapError('The fit was cancelled.', 'cancelled'));
      },
    };
  }

  /** Ends the worker (when the pane closes). */
  dispose(): void {
    this.worker?.terminate();
    this.worker = null;
  }
}
