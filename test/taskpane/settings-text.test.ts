import type { SettingSpec } from '../../src/engine/settings';
import { defaultText, settingsText } from '../../src/taskpane/settings-text';

const specs: SettingSpec[] = Object.freeze([
  { name: 'tails', type: 'choice', default: 'clamp', choices: ['clamp', 'linear'], describe: '' },
  { name: 'seed', type: 'integer', default: 0, describe: '' },
  { name: 'eps', type: 'number', default: 0.5, describe: '' },
  { name: 'debias', type: 'boolean', default: true, describe: '' },
]) as SettingSpec[];

describe('settingsText', () => {
  test('writes only values that differ from the default, in the order of the specs', () => {
    expect(settingsText(specs, { seed: '7', tails: 'clamp', eps: '0.50', debias: 'TRUE' })).toBe('seed=7');
    expect(settingsText(specs, { debias: 'FALSE', tails: 'linear' })).toBe('tails=linear; debias=FALSE');
    expect(settingsText(specs, {})).toBe('');
  });

  test('defaults are shown as Excel writes them', () => {
    expect(defaultText(specs[3])).toBe('TRUE');
    expect(defaultText(specs[2])).toBe('0.5');
  });
});
