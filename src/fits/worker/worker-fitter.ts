import { RemapError } from '../../engine/errors';
import type { FitContext, TransportMap } from '../../engine/map';
import { parseMapJSON } from '../../engine/map-json';
import { restoreMap } from '../../engine/methods';
import type { Sample } from '../../engine/points';
import type { Fitter } from '../fit-service';
import type { FitReply, SampleFitRequest } from './messages';

/** What the pool needs of a worker (a Web Worker in the add-in; a fake in tests). */
export interface WorkerLike {
  postMessage(message: unknown): void;
  terminate(): void;
  addEventListener(type: 'message', listener: (ev: MessageEvent<FitReply>) => void): void;
  addEventListener(type: 'error', listener: (ev: ErrorEvent) => void): void;
  removeEventListener(type: 'message', listener: (ev: MessageEvent<FitReply>) => void): void;
  removeEventListener(type: 'error', listener: (ev: ErrorEvent) => void): void;
}

export interface WorkerFitterOptions {
  /** Makes a worker (default: new Worker('fit-worker.js'), next to the page). */
  readonly make?: () => WorkerLike;
  /** Workers fitting at the same time (default 2: one per core of a small machine); more fits wait their turn. */
  readonly max?: number;
  /** Methods fitted on the page itself (closed forms quick even at Excel's row limit); the others go to a worker. */
  readonly onPage?: ReadonlySet<string>;
  /** Milliseconds between two checks of a fit's cancel signal (default 100). */
  readonly pollMs?: number;
  /** Fits on the page: used for the methods in `onPage`, and for every fit once workers turn out not to work. */
  readonly fallback: Fitter;
}

/**
 * The methods fitted on the page: closed forms or a sort, about a second at
 * most at Excel's row limit, where moving samples and map to a worker and back
 * would cost about as much as the fit. Design choice.
 */
export const PAGE_METHODS: ReadonlySet<string> = new Set(['quantile', 'step', 'ordinal', 'linear']);

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
  const max = Math.max(1, options.max ?? 2);
  const onPage = options.onPage ?? PAGE_METHODS;
  const pollMs = options.pollMs ?? 100;
  const idle: WorkerLike[] = [];
  const waiting: (() => void)[] = [];
  let busy = 0;
  let broken = false;
  let nextId = 1;

  const acquire = async (): Promise<WorkerLike> => {
    while (idle.length === 0 && busy >= max) await new Promise<void>((r) => waiting.push(r));
    busy++;
    const w = idle.pop();
    if (w) return w;
    try {
      return make();
    } catch (e) {
      busy--;
      throw e;
    }
  };
  const release = (w: WorkerLike | null): void => {
    busy--;
    if (w) idle.push(w);
    waiting.shift()?.();
  };

  const inWorker = async (method: string, source: Sample, target: Sample, settings: Record<string, unknown>, ctx: FitContext): Promise<TransportMap> => {
    let worker: WorkerLike;
    try {
      worker = await acquire();
    } catch {
      broken = true;
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
          reject(new RemapError(m.message, m.kind === 'num' || m.kind === 'na' || m.kind === 'cancelled' ? m.kind : 'value'));
        }
      };
      const onError = (ev: ErrorEvent): void => {
        // The worker script did not load or crashed: fit on the page from now on.
        ev.preventDefault?.();
        finish(false);
        broken = true;
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
    if (broken || onPage.has(method)) return options.fallback(method, source, target, settings, ctx);
    return inWorker(method, source, target, settings, ctx);
  };
}

/** A copy of a sample for the worker (structured clone copies anyway; this keeps the caller's arrays out of reach). */
function copy(s: Sample): Sample {
  return { n: s.n, d: s.d, data: Float64Array.from(s.data), weights: s.weights ? Float64Array.from(s.weights) : null };
}
