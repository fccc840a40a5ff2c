import * as path from 'path';
import { Worker } from 'worker_threads';
import type { WorkerReply, WorkerTask } from './messages';

/**
 * Up to `size` worker threads of the `remap` command (cli-worker), started when first needed and given tasks in the
 * order they come. The compiled command starts build/cli/cli/parallel/cli-worker.js; run from its TypeScript sources
 * (a development checkout, the tests) a worker registers tsx first.
 */
export class WorkerPool {
  private readonly idle: Worker[] = [];
  private readonly all: Worker[] = [];
  private readonly waiting: { task: WorkerTask; transfer: ArrayBuffer[]; done: (r: WorkerReply) => void }[] = [];

  /** @param size the most threads at once (>= 1). */
  constructor(readonly size: number) {}

  /** Runs a task on the next free worker; the buffers in `transfer` move to it (the caller must not use them after). */
  run(task: WorkerTask, transfer: ArrayBuffer[] = []): Promise<WorkerReply> {
    return new Promise((done) => {
      this.waiting.push({ task, transfer, done });
      this.next();
    });
  }

  /** Ends every worker (the caller must, or the process keeps running). */
  async close(): Promise<void> {
    const all = this.all.splice(0);
    this.idle.length = 0;
    await Promise.all(all.map((w) => w.terminate()));
  }

  private next(): void {
    if (this.waiting.length === 0) return;
    let worker = this.idle.pop();
    if (!worker && this.all.length < this.size) worker = this.start();
    if (!worker) return;
    const job = this.waiting.shift()!;
    const w = worker;
    const finish = (reply: WorkerReply): void => {
      w.off('message', onMessage);
      w.off('error', onError);
      this.idle.push(w);
      job.done(reply);
      this.next();
    };
    const onMessage = (reply: WorkerReply): void => finish(reply);
    const onError = (e: Error): void => {
      // A worker that failed is not reused.
      w.off('message', onMessage);
      this.all.splice(this.all.indexOf(w), 1);
      job.done({ kind: 'error', message: e.message });
      this.next();
    };
    w.on('message', onMessage);
    w.once('error', onError);
    w.postMessage(job.task, job.transfer);
  }

  private start(): Worker {
    const script = path.join(__dirname, 'cli-worker');
    const worker = __filename.endsWith('.ts')
      ? // tsx is found from this file (the checkout), not from the working folder the command runs in.
        new Worker(`require(${JSON.stringify(require.resolve('tsx/cjs/api'))}).register(); require(${JSON.stringify(script + '.ts')});`, { eval: true })
      : new Worker(script + '.js');
    this.all.push(worker);
    return worker;
  }
}
