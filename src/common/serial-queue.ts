/**
 * Runs jobs one at a time, each after every job queued before it has settled
 * (whether it succeeded or failed). The workbook store uses one so that two
 * writers never interleave their requests; the headless demo so that two
 * workbook runs never share the spreadsheet engine at once.
 */
export class SerialQueue {
  private tail: Promise<unknown> = Promise.resolve();

  /**
   * Queues `job`; the promise settles as the job does. A failed job does not
   * stop the ones queued after it. O(1).
   * @example const q = new SerialQueue(); q.run(async () => 1); await q.run(async () => 2) // 2, after the first
   */
  run<T>(job: () => Promise<T>): Promise<T> {
    const r = this.tail.then(job, job);
    this.tail = r.then(
      () => undefined,
      () => undefined,
    );
    return r;
  }
}
