import { SolveControl } from '../../../src/engine/entropic/solve-control';
import { RemapError } from '../../../src/engine/errors';
import type { Progress } from '../../../src/engine/map';

describe('solve-control', () => {
  test('tick counts iterations and reports progress with step, of, loss and elapsed time', () => {
    const seen: Progress[] = [];
    const c = new SolveControl({ onProgress: (p) => seen.push(p) }, 50, 0);
    c.tick(0.5);
    c.tick(0.25);
    expect(c.step).toBe(2);
    expect(seen.map((p) => [p.step, p.of, p.loss])).toEqual([
      [1, 50, 0.5],
      [2, 50, 0.25],
    ]);
    expect(seen[0].elapsedMs).toBeGreaterThanOrEqual(0);
  });

  test('tick throws RemapError of kind cancelled once the signal is aborted', () => {
    const signal = { aborted: false };
    const c = new SolveControl({ signal }, 10);
    c.tick(1);
    signal.aborted = true;
    expect(() => c.tick(1)).toThrow(RemapError);
    try {
      c.tick(1);
    } catch (e) {
      expect((e as RemapError).kind).toBe('cancelled');
      expect((e as RemapError).message).toMatch(/cancelled/);
    }
  });
});
