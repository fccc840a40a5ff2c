import { RemapError } from '../../../src/engine/errors';
import type { FitContext, TransportMap } from '../../../src/engine/map';
import { startFit } from '../../../src/engine/methods';
import type { Sample } from '../../../src/engine/points';
import type { FitReply, SampleFitRequest } from '../../../src/fits/worker/messages';
import { runSampleFit } from '../../../src/fits/worker/samples-job';
import { workerFitter, type WorkerLike } from '../../../src/fits/worker/worker-fitter';

/** A stand-in for a Web Worker: runs the worker's own job in this process, a tick later, and records what happens to it. */
class FakeWorker implements WorkerLike {
  static made = 0;
  /** Milliseconds before the job starts (a real worker takes a while to receive and start it). */
  static delay = 1;
  terminated = false;
  posted: SampleFitRequest[] = [];
  private readonly listeners: { message: ((ev: MessageEvent<FitReply>) => void)[]; error: ((ev: ErrorEvent) => void)[] } = { message: [], error: [] };
  constructor() {
    FakeWorker.made++;
  }
  postMessage(m: unknown): void {
    const req = m as SampleFitRequest;
    this.posted.push(req);
    const send = (data: FitReply) => !this.terminated && this.listeners.message.forEach((l) => l({ data } as MessageEvent<FitReply>));
    setTimeout(() => {
      if (this.terminated) return;
      runSampleFit(req, (progress) => send({ type: 'progress', id: req.id, progress })).then(
        (json) => send({ type: 'map', id: req.id, json }),
        (e: RemapError) => send({ type: 'error', id: req.id, message: e.message, kind: e.kind }),
      );
    }, FakeWorker.delay);
  }
  terminate(): void {
    this.terminated = true;
  }
  addEventListener(type: 'message' | 'error', l: never): void {
    (this.listeners[type] as unknown[]).push(l);
  }
  removeEventListener(type: 'message' | 'error', l: never): void {
    const list = this.listeners[type] as unknown[];
    list.splice(list.indexOf(l), 1);
  }
}

const sample = (xs: number[][]): Sample => ({ n: xs.length, d: xs[0].length, data: Float64Array.from(xs.flat()), weights: null });
const src = sample(Array.from({ length: 40 }, (_, i) => [Math.sin(i), Math.cos(2 * i)]));
const tgt = sample(Array.from({ length: 40 }, (_, i) => [2 * Math.sin(3 * i) + 1, Math.cos(i) - 1]));
const ctx = (signal?: { aborted: boolean }): FitContext => ({ signal, dropped: { source: 0, target: 0 }, columns: null });

describe('fits in a worker (workerFitter)', () => {
  test('an entropic fit in the worker gives the same map, bit for bit, as fitting on the page', async () => {
    const workers: FakeWorker[] = [];
    const fitter = workerFitter({ make: () => (workers.push(new FakeWorker()), workers[workers.length - 1]), fallback: startFit });
    const viaWorker = await (fitter('entropic', src, tgt, { seed: 7 }, ctx()) as Promise<TransportMap>);
    const onPage = await startFit('entropic', src, tgt, { seed: 7 }, ctx());
    // Source: design choice (same inputs give bit-identical output wherever the fit runs; JSON keeps every double exactly, ECMA-262 Number::toString)
    expect(workers).toHaveLength(1);
    expect(viaWorker.apply(src).data).toEqual(onPage.apply(src).data);
    expect(viaWorker.cost().w2Squared).toBe(onPage.cost().w2Squared);
  });

  test('closed-form methods are fitted on the page and never reach a worker', () => {
    let made = 0;
    const fitter = workerFitter({ make: () => (made++, new FakeWorker()), fallback: startFit });
    const map = fitter('linear', src, tgt, {}, ctx());
    // Source: design choice (PAGE_METHODS: quantile, step, ordinal, linear)
    expect(map instanceof Promise).toBe(false);
    expect(made).toBe(0);
  });

  test("cancelling ends the fit's worker and rejects with a cancelled error", async () => {
    const workers: FakeWorker[] = [];
    const signal = { aborted: false };
    const fitter = workerFitter({ make: () => (workers.push(new FakeWorker()), workers[workers.length - 1]), fallback: startFit, pollMs: 5 });
    FakeWorker.delay = 200;
    const run = fitter('entropic', src, tgt, {}, ctx(signal)) as Promise<TransportMap>;
    signal.aborted = true;
    // Source: design choice (Excel's cancel stops any method at once by ending its worker)
    await expect(run).rejects.toMatchObject({ kind: 'cancelled' });
    expect(workers[0].terminated).toBe(true);
    FakeWorker.delay = 1;
  });

  test('when no worker can start, fits run on the page', async () => {
    const fitter = workerFitter({
      make: () => {
        throw new Error('workers are not allowed here');
      },
      fallback: startFit,
    });
    const map = await fitter('entropic', src, tgt, { seed: 7 }, ctx());
    // Source: design choice (a missing worker never costs the user the result)
    expect(map.method).toBe('entropic');
  });

  test('at most `max` workers fit at once; the next fit reuses a finished worker', async () => {
    FakeWorker.made = 0;
    const fitter = workerFitter({ make: () => new FakeWorker(), fallback: startFit, max: 1 });
    const a = fitter('entropic', src, tgt, { seed: 1 }, ctx()) as Promise<TransportMap>;
    const b = fitter('entropic', src, tgt, { seed: 2 }, ctx()) as Promise<TransportMap>;
    await Promise.all([a, b]);
    // Source: design choice (max workers; idle ones are kept)
    expect(FakeWorker.made).toBe(1);
  });
});
