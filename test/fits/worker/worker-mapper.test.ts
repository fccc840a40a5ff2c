import { fitMap, type TransportMap } from '../../../src/engine';
import type { Points } from '../../../src/engine/points';
import { MapJobs } from '../../../src/fits/worker/map-job';
import type { FitReply, MapPointsRequest } from '../../../src/fits/worker/messages';
import { pageWorkers, type WorkerLike } from '../../../src/fits/worker/page-workers';
import { workerMapper } from '../../../src/fits/worker/worker-mapper';

/** A stand-in for a Web Worker that maps rows with the worker's own job, a tick later; `fail` makes it crash instead. */
class FakeWorker implements WorkerLike {
  static made = 0;
  static fail = false;
  readonly jobs = new MapJobs();
  posted: MapPointsRequest[] = [];
  private readonly listeners: { message: ((ev: MessageEvent<FitReply>) => void)[]; error: ((ev: ErrorEvent) => void)[] } = { message: [], error: [] };
  constructor() {
    FakeWorker.made++;
  }
  postMessage(m: unknown): void {
    const req = m as MapPointsRequest;
    this.posted.push(req);
    setTimeout(() => {
      if (FakeWorker.fail) {
        this.listeners.error.forEach((l) => l({ preventDefault: () => undefined } as ErrorEvent));
        return;
      }
      let data: FitReply;
      try {
        data = this.jobs.run(req);
      } catch (e) {
        data = { type: 'error', id: req.id, message: (e as Error).message, kind: (e as { kind?: string }).kind ?? 'value' };
      }
      this.listeners.message.forEach((l) => l({ data } as MessageEvent<FitReply>));
    }, 1);
  }
  terminate(): void {}
  addEventListener(type: 'message' | 'error', l: never): void {
    (this.listeners[type] as unknown[]).push(l);
  }
  removeEventListener(type: 'message' | 'error', l: never): void {
    const list = this.listeners[type] as unknown[];
    list.splice(list.indexOf(l), 1);
  }
}

// Design choice: rows from fixed formulas; an entropic map on 300 rows of 3 columns.
const rows = (n: number, f: (i: number, k: number) => number): Points => ({
  n,
  d: 3,
  data: Float64Array.from({ length: 3 * n }, (_, j) => f(Math.floor(j / 3), j % 3)),
});
let map: TransportMap;
beforeAll(async () => {
  const src = rows(300, (i, k) => Math.sin(i * (k + 1)) * (1 + k));
  const tgt = rows(300, (i, k) => Math.cos(i * 0.7 + k) ** 3 * 2 + k);
  map = await fitMap('entropic', { ...src, weights: null }, { ...tgt, weights: null }, { seed: 3 });
});

beforeEach(() => {
  FakeWorker.made = 0;
  FakeWorker.fail = false;
});

describe('maps applied in the page workers (workerMapper)', () => {
  test('a heavy call is cut into one piece per worker and gives the numbers mapping on the page gives, bit for bit', async () => {
    const made: FakeWorker[] = [];
    const workers = pageWorkers(() => (made.push(new FakeWorker()), made[made.length - 1]), 2);
    const mapper = workerMapper({ workers, minWork: 1000 });
    const x = rows(501, (i, k) => Math.sin(i * 0.37 + k) * 2.5);
    const viaWorkers = await mapper(map, x, 'apply');
    const onPage = map.apply(x);
    // Source: design choice: rows are mapped one by one, so the pieces cannot change a number.
    expect(Array.from(viaWorkers.data)).toEqual(Array.from(onPage.data));
    expect(viaWorkers.outside).toBe(onPage.outside);
    expect(made).toHaveLength(2);
    expect(made.map((w) => w.posted[0].points.n).sort()).toEqual([250, 251]);
  });

  test('a light call stays on the page, and so does every call once a worker has crashed', async () => {
    const workers = pageWorkers(() => new FakeWorker(), 2);
    const mapper = workerMapper({ workers, minWork: 1e12 });
    const x = rows(10, (i, k) => i - k);
    // Source: design choice: below the work threshold the call is answered at once, on the page.
    expect(mapper(map, x, 'apply')).not.toBeInstanceOf(Promise);
    expect(FakeWorker.made).toBe(0);
    FakeWorker.fail = true;
    const eager = workerMapper({ workers, minWork: 1 });
    const r = await eager(map, x, 'apply');
    expect(Array.from(r.data)).toEqual(Array.from(map.apply(x).data));
    expect(workers.broken).toBe(true);
    expect(eager(map, x, 'apply')).not.toBeInstanceOf(Promise);
  });

  test("the map's own error comes back as the same message (inverting a value outside the target's hull)", async () => {
    const workers = pageWorkers(() => new FakeWorker(), 2);
    const mapper = workerMapper({ workers, minWork: 1 });
    const far = rows(4, () => 1e3);
    let onPage = '';
    try {
      map.invert(far);
    } catch (e) {
      onPage = (e as Error).message;
    }
    // Source: design choice: a call with an error in a worker is mapped again on the page, so the error is worded as there
    // (the row number and the count of failed rows are those of the whole call).
    expect(onPage).toMatch(/not a value the map produces/);
    await expect(mapper(map, far, 'invert')).rejects.toThrow(onPage);
  });
});
