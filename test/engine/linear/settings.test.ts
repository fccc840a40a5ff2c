import { LINEAR_SETTINGS } from '../../../src/engine/linear/settings';
import { resolveSettings } from '../../../src/engine/settings';

describe('LINEAR_SETTINGS declares ridge: a number >= 0, default 0', () => {
  test('defaults to 0 and reads numeric text', () => {
    expect(resolveSettings('linear', LINEAR_SETTINGS, {})).toEqual({ ridge: 0 });
    expect(resolveSettings('linear', LINEAR_SETTINGS, { RIDGE: '1e-6' })).toEqual({ ridge: 1e-6 });
  });

  test('refuses a negative ridge', () => {
    expect(() => resolveSettings('linear', LINEAR_SETTINGS, { ridge: -0.5 })).toThrow(/must be at least 0, not -0.5/);
  });
});
