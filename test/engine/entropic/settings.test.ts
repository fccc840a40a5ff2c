import { ENTROPIC_SETTINGS, readEntropicSettings } from '../../../src/engine/entropic/settings';
import { RemapError } from '../../../src/engine/errors';
import { resolveSettings } from '../../../src/engine/settings';

describe('entropic settings', () => {
  test('readEntropicSettings fills defaults: smoothing 0 (choose from the data), 1000 iterations, tolerance 1e-4, seed 1', () => {
    // Source: the documented defaults. The tolerance default was 1e-6 until the speed work: against 1e-6, 1e-4 moves
    // the fitted map by under 1e-6 % of the target variance (bench/entropic.bench.ts prints the measured change).
    expect(readEntropicSettings({})).toEqual({ smoothing: 0, maxIterations: 1000, tolerance: 1e-4, seed: 1, units: 'standardised' });
  });

  test('resolveSettings accepts the entropic settings by name and rejects a negative smoothing and the old name eps', () => {
    const s = resolveSettings('entropic', ENTROPIC_SETTINGS, { Smoothing: '0.5', 'Max-Iterations': 20, units: 'raw' });
    expect(readEntropicSettings(s)).toEqual({ smoothing: 0.5, maxIterations: 20, tolerance: 1e-4, seed: 1, units: 'raw' });
    expect(() => resolveSettings('entropic', ENTROPIC_SETTINGS, { smoothing: -1 })).toThrow(/smoothing/);
    expect(() => resolveSettings('entropic', ENTROPIC_SETTINGS, { eps: 0.1 })).toThrow(/Unknown setting "eps"/);
  });

  test('readEntropicSettings rejects values outside their range with RemapError', () => {
    expect(() => readEntropicSettings({ tolerance: 0 })).toThrow(RemapError);
    expect(() => readEntropicSettings({ max_iterations: 2.5 })).toThrow(/whole number/);
  });
});
