import { chooseMethod } from '../engine/auto';
import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import { getMethod } from '../engine/methods';
import type { Sample } from '../engine/points';
import type { CellIn } from '../input/cells';
import { readSample, readSettings, readText, type ReadSample } from '../input/coerce';
import { makeHandle } from './handles';
import { splitBudget } from './time-budget';

/** The data of one fit, read from cells. */
export interface FitInputs {
  /** The function (or door) the fit was asked for by, for messages, e.g. "REMAP.FIT". */
  readonly fn: string;
  readonly method: string;
  readonly reason: string | null;
  readonly source: ReadSample;
  readonly target: ReadSample;
  /** The settings the engine sees (a time budget Remap enforces itself is taken out). */
  readonly settings: Record<string, unknown>;
  readonly handle: string;
  /** Seconds a fit may run before Remap stops it, for methods without their own time_budget setting. */
  readonly budgetSeconds: number;
}

/** The cells that describe one fit, by name (so no caller can swap two of them by position). */
export interface FitCells {
  readonly source: CellIn;
  readonly target: CellIn;
  readonly method?: CellIn;
  readonly settings?: CellIn;
  readonly sourceWeights?: CellIn;
  readonly targetWeights?: CellIn;
}

/**
 * Reads source, target, weights, method and settings through the coercion
 * module, resolves `auto`, and derives the handle from the method, the data's
 * exact bits and the settings. O(n d) besides the auto choice.
 * @throws RemapError naming `fn` and the argument for any bad input.
 */
export function readFit(fn: string, cells: FitCells): FitInputs {
  const s = readSample(cells.source, { name: 'source', fn, weights: cells.sourceWeights, weightsName: 'source_weights' });
  const t = readSample(cells.target, { name: 'target', fn, weights: cells.targetWeights, weightsName: 'target_weights' });
  if (s.sample.d !== t.sample.d) {
    throw new RemapError(
      `${fn}: the source has ${s.sample.d} column${s.sample.d === 1 ? '' : 's'} and the target ${t.sample.d}; select the same columns, in the ` +
        `same order, for both.`,
    );
  }
  const raw = readSettings(cells.settings, fn);
  let name = readText(cells.method, 'method', fn, '');
  let reason: string | null = null;
  if (name === '' || name === 'auto') {
    const choice = chooseMethod(s.sample, t.sample, raw, name === 'auto');
    name = choice.method;
    reason = choice.reason;
  }
  getMethod(name); // an unknown method fails here, listing the known ones
  // A budget Remap enforces never changes a finished map, so it stays out of the handle.
  const { settings: engineSettings, budget } = splitBudget(name, raw, fn);
  const handle = makeHandle(name, s.sample.n, s.sample.d, fingerprintFit(name, s.sample, t.sample, engineSettings));
  return { fn, method: name, reason, source: s, target: t, settings: engineSettings, handle, budgetSeconds: budget };
}

function fingerprintFit(method: string, s: Sample, t: Sample, raw: Record<string, unknown>): string {
  const f = new Fingerprint().text(method).word(s.d);
  f.numbers(s.data).numbers(s.weights).numbers(t.data).numbers(t.weights);
  for (const k of Object.keys(raw).sort()) f.text(k.toLowerCase()).text(String(raw[k]));
  return f.hex();
}
