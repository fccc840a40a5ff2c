import type { SettingSpec, SettingValue } from '../engine/settings';

/**
 * Turns the pane's settings fields into the settings text of the formula:
 * only values that differ from the default are written, in the order of the
 * specs, as "name=value" pairs joined by "; ". Pure; O(#specs).
 * @param specs the method's settings (settingSpecs(), plus Remap's time budget where it applies).
 * @param entered what the user typed or chose, by name ("" or missing = default).
 * @example settingsText([{ name: 'seed', type: 'integer', default: 0, describe: '' }], { seed: '7' }) // 'seed=7'
 */
export function settingsText(specs: readonly SettingSpec[], entered: Readonly<Record<string, string>>): string {
  const out: string[] = [];
  for (const s of specs) {
    const raw = (entered[s.name] ?? '').trim();
    if (raw === '' || sameAsDefault(s, raw)) continue;
    out.push(`${s.name}=${raw}`);
  }
  return out.join('; ');
}

function sameAsDefault(s: SettingSpec, raw: string): boolean {
  if (s.type === 'number' || s.type === 'integer') return Number(raw) === Number(s.default);
  return raw.toLowerCase() === String(s.default).toLowerCase();
}

/**
 * A setting's default as the pane shows it. O(1).
 * @example defaultText({ name: 'tails', type: 'choice', default: 'clamp', describe: '' }) // 'clamp'
 */
export function defaultText(s: { readonly default: SettingValue }): string {
  return typeof s.default === 'boolean' ? (s.default ? 'TRUE' : 'FALSE') : String(s.default);
}
