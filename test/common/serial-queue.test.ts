import { SerialQueue } from '../../src/common/serial-queue';

const tick = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('SerialQueue', () => {
  test('runs jobs one at a time in the order they were queued, even when a later one would finish first', async () => {
    // Source: design choice (one writer at a time)
    const q = new SerialQueue();
    const log: string[] = [];
    const job = (name: string, ms: number) => async () => {
      log.push(`start ${name}`);
      await tick(ms);
      log.push(`end ${name}`);
      return name;
    };
    const results = await Promise.all([q.run(job('a', 30)), q.run(job('b', 1)), q.run(job('c', 10))]);
    expect(results).toEqual(['a', 'b', 'c']);
    expect(log).toEqual(['start a', 'end a', 'start b', 'end b', 'start c', 'end c']);
  });

  test('a failed job rejects its own promise and the next job still runs', async () => {
    // Source: design choice (a failed write must not block the store)
    const q = new SerialQueue();
    const failed = q.run(async () => {
      throw new Error('no');
    });
    const next = q.run(async () => 'yes');
    await expect(failed).rejects.toThrow('no');
    await expect(next).resolves.toBe('yes');
  });
});
