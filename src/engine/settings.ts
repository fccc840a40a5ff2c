import { RemapError } from './errors';

/** A setting's value as it is stored in a map's JSON and shown in reports. */
export type SettingValue = number | string | boolean;
export type Settings = Readonly<Record<string, SettingValue>>;

/**
 * Declares one tunable setting of a method: its name as typed in a formula or on
 * the command line (lower case, words joined by `_`), its type, default and
 * allowed range. Each method lists its specs once; `resolveSettings` is the only
 * place that reads user-given settings.
 */
export interface SettingSpec {
  readonly name: string;
  readonly type: 'number' | 'integer' | 'choice' | 'boolean';
  readonly default: SettingValue;
  /** Smallest allowed value (numbers), inclusive unless `minExclusive`. */
  readonly min?: number;
  readonly minExclusive?: boolean;
  readonly max?: number;
  readonly choices?: readonly string[];
  /** One line for tooltips, the pane and the README. */
  readonly describe: string;
}

/**
 * The `tails` setting, for the methods that honour it (quantile, step, ordinal,
 * gradient-net): what happens to values outside the fitted range. Methods that
 * do not honour it (linear, pairs, entropic) do not list it, so giving it to
 * them is an error that lists what they take; each method's `outside` text
 * (outside.ts) says what it does instead.
 */
export const TAILS_SETTING = {
  name: 'tails',
  type: 'choice',
  default: 'clamp',
  choices: ['clamp', 'linear'],
  describe: 'What happens to values outside the fitted range: clamp to the edge (default) or continue the end slope linearly.',
} as const satisfies SettingSpec;

/**
 * Settings every method takes: none. `tails` moved into the specs of the
 * methods that honour it (TAILS_SETTING).
 * @deprecated Lists only TAILS_SETTING, for callers that still build a
 *   gradient-net settings list from it; `settingSpecs` no longer reads it.
 */
export const COMMON_SETTINGS: readonly SettingSpec[] = [TAILS_SETTING];

/**
 * Checks user-given settings against `specs` and fills in defaults. Names are
 * case-insensitive and may use `-` or `_`. Numbers may arrive as numeric text.
 * An unknown name is an error that lists the known ones.
 * Cost: O(#specs + #raw).
 * @throws RemapError naming the setting, the method and the allowed range.
 * @example resolveSettings('linear', LINEAR_SETTINGS, { RIDGE: '0.1' }) // { ridge: 0.1, units: 'standardised' }
 */
export function resolveSettings(method: string, specs: readonly SettingSpec[], raw: Readonly<Record<string, unknown>> = {}): Settings {
  const out: Record<string, SettingValue> = {};
  for (const s of specs) out[s.name] = s.default;
  const known = new Map(specs.map((s) => [s.name, s]));
  for (const [rawName, rawValue] of Object.entries(raw)) {
    const name = normaliseName(rawName);
    const spec = known.get(name);
    if (!spec) {
      const names = specs.map((s) => s.name).join(', ');
      throw new RemapError(`Unknown setting "${rawName}" for method ${method}. Known settings: ${names || '(none)'}.`);
    }
    out[name] = coerceSetting(method, spec, rawValue);
  }
  return Object.freeze(out);
}

/** `Max-Iterations` -> `max_iterations`. */
export function normaliseName(name: string): string {
  return name
    .trim()
    .toLowerCase()
    .replace(/[-\s]+/g, '_');
}

function coerceSetting(method: string, spec: SettingSpec, value: unknown): SettingValue {
  const where = `setting ${spec.name} of method ${method}`;
  switch (spec.type) {
    case 'boolean': {
      if (typeof value === 'boolean') return value;
      const t = String(value).trim().toLowerCase();
      if (['true', 'yes', '1', 'on'].includes(t)) return true;
      if (['false', 'no', '0', 'off'].includes(t)) return false;
      throw new RemapError(`The ${where} must be TRUE or FALSE, not "${String(value)}".`);
    }
    case 'choice': {
      const t = String(value).trim().toLowerCase();
      if (!spec.choices || !spec.choices.includes(t)) {
        throw new RemapError(`The ${where} must be one of ${(spec.choices ?? []).join(', ')}, not "${String(value)}".`);
      }
      return t;
    }
    case 'number':
    case 'integer': {
      const v = typeof value === 'number' ? value : typeof value === 'string' && value.trim() !== '' ? Number(value.trim()) : NaN;
      if (!Number.isFinite(v)) throw new RemapError(`The ${where} must be a finite number, not "${String(value)}".`);
      if (spec.type === 'integer' && !Number.isInteger(v)) throw new RemapError(`The ${where} must be a whole number, not ${v}.`);
      const lowOk = spec.min === undefined || (spec.minExclusive ? v > spec.min : v >= spec.min);
      const highOk = spec.max === undefined || v <= spec.max;
      if (!lowOk || !highOk) throw new RemapError(`The ${where} must be ${describeRange(spec)}, not ${v}.`);
      return v;
    }
  }
}

/** "between 0 and 1", "greater than 0", ... for messages and docs. */
export function describeRange(spec: SettingSpec): string {
  const lo = spec.min === undefined ? '' : spec.minExclusive ? `greater than ${spec.min}` : `at least ${spec.min}`;
  const hi = spec.max === undefined ? '' : `at most ${spec.max}`;
  if (lo && hi) return `${lo} and ${hi}`;
  return lo || hi || 'a number';
}

/**
 * Parses settings written in one text: `"smoothing=0.05; seed=7"` (separators `;` or
 * `,` or new lines, `=` or `:` between name and value). Empty text gives {}.
 * @throws RemapError on a piece without a name or value.
 * @example parseSettingsText('seed=7; tails=linear') // { seed: '7', tails: 'linear' }
 */
export function parseSettingsText(text: string): Record<string, string> {
  const out: Record<string, string> = Object.create(null);
  for (const piece of text.split(/[;,\n]/)) {
    const p = piece.trim();
    if (p === '') continue;
    const m = /^([A-Za-z][A-Za-z0-9_\- ]*)\s*[=:]\s*(.+)$/.exec(p);
    if (!m) throw new RemapError(`Settings: cannot read "${p}"; write name=value pairs separated by semicolons, e.g. "seed=7; tails=linear".`);
    out[m[1].trim()] = m[2].trim();
  }
  return out;
}

/** The value type a spec declares: numbers for number and integer, text for a choice, true/false for boolean. */
export type SettingValueOf<S extends SettingSpec> = S['type'] extends 'number' | 'integer'
  ? number
  : S['type'] extends 'boolean'
    ? boolean
    : S extends { readonly choices: readonly (infer C)[] }
      ? C
      : string;

/**
 * The typed settings object of a list of specs, keyed by setting name: a method
 * declares its specs once (`as const satisfies readonly SettingSpec[]`) and reads
 * `SettingsOf<typeof SPECS>` instead of raw keys.
 */
export type SettingsOf<S extends readonly SettingSpec[]> = { readonly [K in S[number] as K['name']]: SettingValueOf<K> };

/**
 * The typed view of `settings` for one method's own `specs`: each spec's value,
 * checked and with its default where missing (so a direct engine call may pass
 * `{}`); settings not in `specs` are ignored.
 * The one way methods read their settings. O(#specs + #settings).
 * @throws RemapError naming the setting and its allowed values, for a value outside its spec.
 * @example settingsOf(LINEAR_SETTINGS, { ridge: 0.5, seed: 7 }) // { ridge: 0.5, units: 'standardised' }
 */
export function settingsOf<const S extends readonly SettingSpec[]>(
  specs: S,
  settings: Readonly<Record<string, unknown>>,
  method = 'this method',
): SettingsOf<S> {
  const own: Record<string, unknown> = {};
  const names = new Set(specs.map((s) => s.name));
  for (const [k, v] of Object.entries(settings)) {
    const name = normaliseName(k);
    if (names.has(name)) own[name] = v;
  }
  return resolveSettings(method, specs, own) as unknown as SettingsOf<S>;
}
