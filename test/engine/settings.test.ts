import { settingsOf } from '../../src/engine/settings';
import { COMMON_SETTINGS, parseSettingsText, resolveSettings, type SettingSpec } from '../../src/engine/settings';

const specs: SettingSpec[] = [
  ...COMMON_SETTINGS,
  { name: 'eps', type: 'number', default: 0, min: 0, describe: 'regularisation' },
  { name: 'seed', type: 'integer', default: 1, min: 0, describe: 'seed' },
  { name: 'debias', type: 'boolean', default: true, describe: 'debias' },
];

describe('settings', () => {
  test('resolveSettings fills defaults and reads numeric text, names case-insensitively', () => {
    expect(resolveSettings('entropic', specs, { EPS: '0.5', Seed: 3 })).toEqual({ tails: 'clamp', eps: 0.5, seed: 3, debias: true });
  });

  test('an unknown setting is an error that lists the known ones', () => {
    expect(() => resolveSettings('entropic', specs, { epsilon: 1 })).toThrow(
      'Unknown setting "epsilon" for method entropic. Known settings: tails, eps, seed, debias.',
    );
  });

  test('out-of-range, non-integer and non-choice values are errors naming the setting', () => {
    expect(() => resolveSettings('entropic', specs, { eps: -1 })).toThrow(/setting eps of method entropic must be at least 0, not -1/);
    expect(() => resolveSettings('entropic', specs, { seed: 1.5 })).toThrow(/whole number/);
    expect(() => resolveSettings('entropic', specs, { tails: 'wrap' })).toThrow(/one of clamp, linear/);
    expect(() => resolveSettings('entropic', specs, { debias: 'maybe' })).toThrow(/TRUE or FALSE/);
    expect(() => resolveSettings('entropic', specs, { eps: 'abc' })).toThrow(/finite number/);
  });

  test('parseSettingsText reads name=value pairs split by semicolons, commas or new lines', () => {
    expect({ ...parseSettingsText('seed=7; tails : linear\n eps=0.1') }).toEqual({ seed: '7', tails: 'linear', eps: '0.1' });
    expect({ ...parseSettingsText('  ') }).toEqual({});
    expect(() => parseSettingsText('=3')).toThrow(/cannot read "=3"/);
  });

  test('settings cannot reach an object prototype', () => {
    expect(() => parseSettingsText('__proto__=1')).toThrow(/cannot read "__proto__=1"/);
    const raw = Object.create(null);
    raw['__proto__'] = 1;
    expect(() => resolveSettings('entropic', specs, raw)).toThrow(/Unknown setting "__proto__"/);
  });
});

describe("settingsOf(specs, settings) is the typed view of one method's own settings", () => {
  const SPECS = [
    { name: 'ridge', type: 'number', default: 0, min: 0, describe: 'r' },
    { name: 'mode', type: 'choice', default: 'a', choices: ['a', 'b'], describe: 'm' },
  ] as const;
  // Source: design choice (settingsOf fills defaults and ignores settings of other specs, such as the common tails).
  test('fills defaults, converts numeric text, and ignores settings it does not declare', () => {
    expect(settingsOf(SPECS, {})).toEqual({ ridge: 0, mode: 'a' });
    expect(settingsOf(SPECS, { Ridge: '0.25', tails: 'clamp', mode: 'B' })).toEqual({ ridge: 0.25, mode: 'b' });
  });
  test('refuses a value outside its spec, naming the setting', () => {
    expect(() => settingsOf(SPECS, { ridge: -1 }, 'linear')).toThrow(/setting ridge of method linear must be at least 0, not -1/);
  });
});
