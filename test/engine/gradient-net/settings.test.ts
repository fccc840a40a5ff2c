import { GRADIENT_NET_SETTINGS } from '../../../src/engine/gradient-net/settings';
import { resolveSettings } from '../../../src/engine/settings';

describe('GRADIENT_NET_SETTINGS', () => {
  test('defaults: automatic width, 1 layer, entropic start, 1,500 steps, batch 256, 60 s, wasm, automatic smoothing, standardised units', () => {
    const s = resolveSettings('gradient-net', GRADIENT_NET_SETTINGS, {});
    // Source: design choice (settings.ts)
    expect(s).toMatchObject({
      hidden: 0,
      layers: 1,
      start: 'entropic',
      steps: 1500,
      batch: 256,
      time_budget: 60,
      backend: 'wasm',
      smoothing: 0,
      seed: 0,
      units: 'standardised',
      tails: 'clamp',
    });
    expect(Object.keys(s)).not.toContain('blur');
  });

  test('rejects out-of-range values with the allowed range, and the old name blur', () => {
    expect(() => resolveSettings('gradient-net', GRADIENT_NET_SETTINGS, { hidden: -1 })).toThrow(/at least 0/);
    expect(() => resolveSettings('gradient-net', GRADIENT_NET_SETTINGS, { backend: 'gpu' })).toThrow(/wasm, cpu/);
    expect(() => resolveSettings('gradient-net', GRADIENT_NET_SETTINGS, { time_budget: 0 })).toThrow(/greater than 0/);
    expect(() => resolveSettings('gradient-net', GRADIENT_NET_SETTINGS, { blur: 1 })).toThrow(/Unknown setting "blur"/);
    expect(() => resolveSettings('gradient-net', GRADIENT_NET_SETTINGS, { smoothing: -1 })).toThrow(/at least 0/);
  });
});
