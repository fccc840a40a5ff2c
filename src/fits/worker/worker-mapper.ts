import type { Mapped, TransportMap } from '../../engine/map';
import type { Points } from '../../engine/points';
import { mapInThisThread, type Mapper } from '../map-service';
import { replyError, type FitReply, type MapPointsRequest } from './messages';
import type { PageWorkers, WorkerLike } from './page-workers';

/**
 * Calls of at least this many multiply-adds (rows x the map's `workPerRow`) are mapped in the page's workers: about
 * 20-50 ms of work on one core, more than copying the rows there and back. Design choice.
 */
export const WORKER_MIN_WORK = 2e7;

export interface WorkerMapperOptions {
  /** The page's workers (shared with workerFitter). */
  readonly workers: PageWorkers;
  /** Work per call from which the workers map (default WORKER_MIN_WORK). */
  readonly minWork?: number;
}

/**
 * A Mapper that maps heavy calls (an entropic map over thousands of rows, say) in the page's workers, so Excel's page
 * keeps drawing: the rows are cut into as many pieces as there are workers (each at least `minWork`), each piece is
 * mapped by a worker from the map's JSON, and the pieces come back in order. Rows are mapped one by one, so the
 * numbers are those of mapping on the page, whatever the pieces. Light calls, and every call once a worker has
 * failed, are mapped on the page. A call with an error in any piece (a value with no inverse, say) is mapped again on
 * the page, which throws the error as it would without workers (its row number and counts are the whole call's).
 * Cost: the map's, spread over the workers, plus copying the rows (O(n d)) and, once per worker and map, reading
 * the map's JSON.
 * @example setMapper(workerMapper({ workers })) // REMAP.APPLY of an entropic map on 10,000 rows then runs in the workers
 */
export function workerMapper(options: WorkerMapperOptions): Mapper {
  const { workers } = options;
  const minWork = options.minWork ?? WORKER_MIN_WORK;
  const jsonOf = new WeakMap<TransportMap, string>();
  let nextId = 1;

  const piece = async (json: string, verb: 'apply' | 'invert', points: Points): Promise<{ data: Float64Array; outside: number }> => {
    let worker: WorkerLike;
    try {
      worker = await workers.acquire();
    } catch {
      workers.broken = true;
      throw new WorkerFailed();
    }
    const id = nextId++;
    return new Promise((resolve, reject) => {
      const finish = (keep: boolean): void => {
        worker.removeEventListener('message', onMessage);
        worker.removeEventListener('error', onError);
        if (!keep) worker.terminate();
        workers.release(keep ? worker : null);
      };
      const onMessage = (ev: MessageEvent<FitReply>): void => {
        const m = ev.data;
        if (!m || m.id !== id) return;
        if (m.type === 'mapped') {
          finish(true);
          resolve({ data: m.data, outside: m.outside });
        } else if (m.type === 'error') {
          finish(true);
          reject(replyError(m));
        }
      };
      // (A rejected piece makes the caller map the whole call on the page; see inWorkers.)
      const onError = (ev: ErrorEvent): void => {
        ev.preventDefault?.();
        finish(false);
        workers.broken = true;
        reject(new WorkerFailed());
      };
      worker.addEventListener('message', onMessage);
      worker.addEventListener('error', onError);
      const req: MapPointsRequest = { type: 'map-points', id, json, verb, points: { n: points.n, d: points.d, data: points.data } };
      worker.postMessage(req);
    });
  };

  const inWorkers = async (map: TransportMap, points: Points, verb: 'apply' | 'invert', count: number): Promise<Mapped> => {
    let json = jsonOf.get(map);
    if (json === undefined) {
      json = JSON.stringify(map.toJSON());
      jsonOf.set(map, json);
    }
    const { n, d } = points;
    const cuts = Array.from({ length: count + 1 }, (_, i) => Math.round((n * i) / count));
    try {
      const parts = await Promise.all(
        cuts.slice(0, -1).map((a, i) => piece(json!, verb, { n: cuts[i + 1] - a, d, data: points.data.slice(a * d, cuts[i + 1] * d) })),
      );
      const data = new Float64Array(n * d);
      let outside = 0;
      parts.forEach((p, i) => {
        data.set(p.data, cuts[i] * d);
        outside += p.outside;
      });
      return { n, d, data, outside };
    } catch {
      // A worker that failed, or the map's own error in a piece: the page maps the whole call again, so an error names
      // the row and counts the rows of the whole call, as it would without workers.
      return mapInThisThread(map, points, verb);
    }
  };

  return (map, points, verb) => {
    const work = points.n * map.workPerRow(verb);
    if (workers.broken || work < minWork || points.n < 2) return mapInThisThread(map, points, verb);
    const count = Math.max(1, Math.min(workers.max, Math.floor(work / minWork), points.n));
    return inWorkers(map, points, verb, count);
  };
}

/** A worker that could not start or crashed: the call is mapped on the page instead. */
class WorkerFailed extends Error {}

export type { WorkerLike };
