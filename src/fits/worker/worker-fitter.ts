import { RemapError } from '../../engine/errors';
import type { FitContext, TransportMap } from '../../engine/map';
import { parseMapJSON } from '../../engine/map-json';
import { restoreMap } from '../../engine/methods';
import type { Sample } from '../../engine/points';
import type { Fitter } from '../fit-service';
import { replyError, type FitReply, type SampleFitRequest } from './messages';
import { pageWorkers, type PageWorkers, type WorkerLike } from './page-workers';

export type { WorkerLike } from './page-workers';

export interface WorkerFitterOptions {
  /** Makes a worker (default: new Worker('fit-worker.js'), next to the page). */
  readonly make?: () => WorkerLike;
  /** Workers fitting at the same time (default 2: one per core of a small machine); more fits wait their turn. */
  readonly max?: number;
  /** The page's workers, when shared with workerMapper (default: a pool of its own from `make` and `max`). */
  readonly workers?: PageWorkers;
  /** Methods fitted on the page itself (closed forms quick even at Excel's row limit); the others go to a worker. */
  readonly onPage?: ReadonlySet<string>;
  /** Milliseconds between two checks of a fit's cancel signal (default 100). */
  readonly pollMs?: number;
  /** Fits on the page: used for the methods in `onPage`, and for every fit once workers turn out not to work. */
  readonly fallback: Fitter;
}

/**
 * The methods that may be fitted on the page when the data is small: closed
 * forms or a sort. Design choice.
 */
export const PAGE_METHODS: ReadonlySet<string> = new Set(['quantile', 'step', 'ordinal', 'linear']);

/**
 * The most numbers (source plus target, rows x columns) a PAGE_METHODS fit may
 * have and still run on the page: a sort or a moments pass of 20,000 numbers
 * takes a few milliseconds, less than copying the samples to a worker and the
 * map back; anything larger (up to about a second at Excel's row limit) goes to
 * a worker so the page never blocks. Design choice.
 */
export const PAGE_MAX_NUMBERS = 20_000;

/**
 * A Fitter that runs fits in Web Workers, so a worksheet page never blocks
 * while a map is fitted: the samples go to an idle worker (or a new one, up
 * to `max`), progress comes back as it happens, and the map comes back as JSON
 * (checked by parseMapJSON) with its diagnostics computed. A cancelled or
 * over-budget fit ends its worker at once, whatever the method is doing.
 * If a worker cannot start (no Worker, the script fails to load), this and
 * every later fit runs on the page through `fallback` instead.
 * Cost: that of the fit in the worker, plus O(n d) to copy the samples and
 * O(size of the map) to read it back.
 */
export function workerFitter(options: WorkerFitterOptions): Fitter {
  const make = options.make ?? (() => new Worker('fit-worker.js') as unknown as WorkerLike);
  const workers = options.workers ?? pageWorkers(make, options.max ?? 2);
  const onPage = options.onPage ?? PAGE_METHODS;
  const pollMs = options.pollMs ?? 100;
  let nextId = 1;
  const acquire = () => workers.acquire();
  const release = (w: WorkerLike | null) => workers.release(w);

  const inWorker = async (method: string, source: Sample, target: Sample, settings: Record<string, unknown>, ctx: FitContext): Promise<TransportMap> => {
    let worker: WorkerLike;
    try {
      worker = await acquire();
    } catch {
      workers.broken = true;
      return options.fallback(method, source, target, settings, ctx);
    }
    const id = nextId++;
    const req: SampleFitRequest = {
      type: 'fit-samples',
      id,
      method,
      source: copy(source),
      target: copy(target),
      settings: { ...settings },
      dropped: ctx.dropped ?? { source: 0, target: 0 },
      columns: ctx.columns ?? null,
    };
    return new Promise<TransportMap>((resolve, reject) => {
      let timer: ReturnType<typeof setInterval> | null = null;
      const finish = (keep: boolean): void => {
        if (timer !== null) clearInterval(timer);
        worker.removeEventListener('message', onMessage);
        worker.removeEventListener('error', onError);
        if (!keep) worker.terminate();
        release(keep ? worker : null);
      };
      const onMessage = (ev: MessageEvent<FitReply>): void => {
        const m = ev.data;
        if (!m || m.id !== id) return;
        if (m.type === 'progress') {
          ctx.onProgress?.(m.progress);
          return;
        }
        if (m.type === 'map') {
          finish(true);
          try {
            resolve(restoreMap(parseMapJSON(m.json)));
          } catch (e) {
            reject(e);
          }
          return;
        }
        if (m.type === 'error') {
          finish(true);
          reject(replyError(m));
        }
      };
      const onError = (ev: ErrorEvent): void => {
        // The worker script did not load or crashed: fit on the page from now on.
        ev.preventDefault?.();
        finish(false);
        workers.broken = true;
        Promise.resolve(options.fallback(method, source, target, settings, ctx)).then(resolve, reject);
      };
      worker.addEventListener('message', onMessage);
      worker.addEventListener('error', onError);
      timer = setInterval(() => {
        if (!ctx.signal?.aborted) return;
        finish(false);
        reject(new RemapError(`fit (${method}): cancelled.`, 'cancelled'));
      }, pollMs);
      worker.postMessage(req);
    });
  };

  return (method, source, target, settings, ctx) => {
    const small = (source.n + target.n) * source.d <= PAGE_MAX_NUMBERS;
    if (workers.broken || (onPage.has(method) && small)) return options.fallback(method, source, target, settings, ctx);
    return inWorker(method, source, target, settings, ctx);
  };
}

/** A copy of a sample for the worker (structured clone copies anyway; this keeps the caller's arrays out of reach). */
function copy(s: Sample): Sample {
  return { n: s.n, d: s.d, data: Float64Array.from(s.data), weights: s.weights ? Float64Array.from(s.weights) : null };
}
