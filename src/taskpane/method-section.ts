import { chooseMethod } from '../engine/auto';
import { getMethod, settingSpecs } from '../engine/methods';
import type { SettingSpec } from '../engine/settings';
import { ENFORCED_TIME_BUDGET, hasOwnTimeBudget } from '../fits';
import { readSettings } from '../input';
import { $ } from './dom';
import { fitFormula, type FitFormulaParts } from './formula';
import { pane } from './pane-state';
import { defaultText, settingsText } from './settings-text';

/* Section 2, Method: the method (or auto and its choice), its settings as inputs, and the formula preview. */

/** The method the fit will use: the chosen one, or what auto picks for the data read so far. */
export function effectiveMethod(): { name: string; reason: string | null } {
  const chosen = $<HTMLSelectElement>('method').value;
  if (chosen !== 'auto') return { name: chosen, reason: null };
  const s = pane.samples.source;
  const t = pane.samples.target;
  if (!s || !t || s.sample.d !== t.sample.d) return { name: '', reason: null };
  let raw: Record<string, unknown> = {};
  try {
    raw = readSettings(currentSettingsText(), 'Remap pane');
  } catch {
    raw = {};
  }
  const c = chooseMethod(s.sample, t.sample, raw, true);
  return { name: c.method, reason: c.reason };
}

/** Says what the chosen method does (or what auto picks and why) and lists its settings. */
export function updateMethodInfo(): void {
  const { name, reason } = effectiveMethod();
  const info = $('method-info');
  const chosen = $<HTMLSelectElement>('method').value;
  if (chosen === 'auto') {
    info.textContent = name ? `Auto picks ${name}. ${reason ?? ''}` : 'Auto picks a method once the source and target are chosen.';
  } else {
    info.textContent = getMethod(chosen).summary;
  }
  renderSettings(name || (chosen === 'auto' ? '' : chosen));
  updateFormula();
}

/** The settings a method takes, with the time budget Remap enforces for methods without their own. */
export function specsFor(method: string): SettingSpec[] {
  if (!method) return [];
  const specs = [...settingSpecs(getMethod(method))];
  if (!hasOwnTimeBudget(method)) specs.push(ENFORCED_TIME_BUDGET);
  return specs;
}

/** The fit's time budget in milliseconds, as typed or by default (for the time-left estimate). */
export function budgetMsFor(method: string): number {
  const b = Number(pane.entered.time_budget);
  const spec = specsFor(method).find((s) => s.name === 'time_budget');
  const secs = Number.isFinite(b) && b > 0 ? b : Number(spec?.default ?? Infinity);
  return secs * 1000;
}

function renderSettings(method: string): void {
  if (method === pane.settingsFor) return;
  pane.settingsFor = method;
  const box = $('settings');
  box.replaceChildren();
  const specs = specsFor(method);
  if (specs.length === 0) {
    const p = document.createElement('p');
    p.className = 'hint';
    p.textContent = 'Choose the data first: the settings depend on the method.';
    box.append(p);
  }
  for (const s of specs) box.append(settingField(s));
}

function settingField(s: SettingSpec): HTMLElement {
  const wrap = document.createElement('div');
  wrap.className = 'setting field';
  const id = `setting-${s.name}`;
  const label = document.createElement('label');
  label.htmlFor = id;
  label.textContent = s.name;
  let input: HTMLInputElement | HTMLSelectElement;
  if (s.type === 'choice' || s.type === 'boolean') {
    const sel = document.createElement('select');
    for (const c of s.type === 'boolean' ? ['TRUE', 'FALSE'] : (s.choices ?? [])) {
      const o = document.createElement('option');
      o.value = c;
      o.textContent = c === defaultText(s) ? `${c} (default)` : c;
      sel.append(o);
    }
    sel.value = pane.entered[s.name] || defaultText(s);
    input = sel;
  } else {
    const inp = document.createElement('input');
    inp.type = 'text';
    inp.inputMode = 'decimal';
    inp.placeholder = `default ${defaultText(s)}`;
    inp.value = pane.entered[s.name] ?? '';
    input = inp;
  }
  input.id = id;
  const desc = document.createElement('p');
  desc.className = 'desc';
  desc.id = `${id}-desc`;
  desc.textContent = `${s.describe} Default: ${defaultText(s)}.`;
  input.setAttribute('aria-describedby', desc.id);
  const changed = (): void => {
    pane.entered[s.name] = input.value;
    updateFormula();
  };
  input.addEventListener('change', changed);
  input.addEventListener('input', changed);
  wrap.append(label, input, desc);
  return wrap;
}

/** The settings as the formula gives them: only those changed from their defaults. */
export function currentSettingsText(): string {
  return settingsText(specsFor(pane.settingsFor), pane.entered);
}

/** Shows the settings summary and the formula the Fit button will write. */
export function updateFormula(): void {
  const text = currentSettingsText();
  $('settings-summary').textContent = text ? `(${text})` : '(defaults)';
  try {
    $('formula-preview').textContent = `${fitFormula(formulaParts())}`;
  } catch {
    $('formula-preview').textContent = '';
  }
}

/** The parts of the REMAP.FIT formula as the inputs hold them now. */
export function formulaParts(): FitFormulaParts {
  const v = (id: string) => $<HTMLInputElement>(id).value.trim();
  return {
    source: v('source'),
    target: v('target'),
    method: $<HTMLSelectElement>('method').value,
    settings: currentSettingsText(),
    sourceWeights: v('source-weights'),
    targetWeights: v('target-weights'),
  };
}
