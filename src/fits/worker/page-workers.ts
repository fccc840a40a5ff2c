import type { FitReply } from './messages';

/** What the pool needs of a worker (a Web Worker in the add-in; a fake in tests). */
export interface WorkerLike {
  postMessage(message: unknown, transfer?: Transferable[]): void;
  terminate(): void;
  addEventListener(type: 'message', listener: (ev: MessageEvent<FitReply>) => void): void;
  addEventListener(type: 'error', listener: (ev: ErrorEvent) => void): void;
  removeEventListener(type: 'message', listener: (ev: MessageEvent<FitReply>) => void): void;
  removeEventListener(type: 'error', listener: (ev: ErrorEvent) => void): void;
}

/**
 * The page's fit workers, shared by fits (workerFitter) and by heavy applications of maps (workerMapper): at most
 * `max` at work at once, idle ones reused, the rest waiting their turn. Once a worker fails to start or crashes,
 * `broken` is set and callers work on the page instead.
 */
export interface PageWorkers {
  readonly max: number;
  broken: boolean;
  /** An idle worker, or a new one while fewer than `max` are at work; waits otherwise. Throws if a worker cannot be made. */
  acquire(): Promise<WorkerLike>;
  /** Gives a worker back (null: it was ended and is not reused). */
  release(w: WorkerLike | null): void;
}

/**
 * A pool of page workers made by `make`, at most `max` (>= 1) at work at once. O(1) per call.
 * @example const workers = pageWorkers(() => new Worker('fit-worker.js') as unknown as WorkerLike, 2)
 */
export function pageWorkers(make: () => WorkerLike, max: number): PageWorkers {
  const idle: WorkerLike[] = [];
  const waiting: (() => void)[] = [];
  let busy = 0;
  const pool: PageWorkers = {
    max: Math.max(1, max),
    broken: false,
    async acquire(): Promise<WorkerLike> {
      while (idle.length === 0 && busy >= pool.max) await new Promise<void>((r) => waiting.push(r));
      busy++;
      const w = idle.pop();
      if (w) return w;
      try {
        return make();
      } catch (e) {
        busy--;
        waiting.shift()?.();
        throw e;
      }
    },
    release(w: WorkerLike | null): void {
      busy--;
      if (w) idle.push(w);
      waiting.shift()?.();
    },
  };
  return pool;
}
