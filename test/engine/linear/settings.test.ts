import { LINEAR_SETTINGS } from '../../../src/engine/linear/settings';
import { resolveSettings } from '../../../src/engine/settings';

describe('LINEAR_SETTINGS declares ridge (a number >= 0, default 0) and units (standardised by default)', () => {
  test('defaults to ridge 0 in standardised units and reads numeric text', () => {
    // Source: design choice (defaults)
    expect(resolveSettings('linear', LINEAR_SETTINGS, {})).toEqual({ ridge: 0, units: 'standardised' });
    expect(resolveSettings('linear', LINEAR_SETTINGS, { RIDGE: '1e-6', units: 'RAW' })).toEqual({ ridge: 1e-6, units: 'raw' });
  });

  test('refuses a negative ridge', () => {
    expect(() => resolveSettings('linear', LINEAR_SETTINGS, { ridge: -0.5 })).toThrow(/must be at least 0, not -0.5/);
  });
});
