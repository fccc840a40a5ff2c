/**
 * A fuzzer for saved maps: it takes the JSON a fitted map of each registered method wrote
 * and mutates it (drops, replaces or retypes a field, changes an array's length, writes
 * numbers such as 1e999, adds hostile keys, cuts or garbles the text). Contract: every
 * mutation is either refused by parseMapJSON + the method's fromJSON with a RemapError, or
 * loads to a map whose apply, invert, diagnostics and report give finite numbers or
 * RemapErrors; never a raw exception, never a change to Object.prototype.
 * Source: common practice (property-based robustness testing); no expected numbers here.
 */
import fc from 'fast-check';
import { isRemapError } from '../../src/engine/errors';
import { parseMapJSON } from '../../src/engine/map-json';
import type { Mapped, TransportMap } from '../../src/engine/map';
import { readValues, writeValues } from '../../src/input/coerce';
import { fitMap, listMethods, restoreMap } from '../../src/engine/methods';
import { sample, points } from '../../src/engine/points';
import { reportTable } from '../../src/fits/report-table';
import { assertProperty } from './arbitraries';

const SMALL: Record<string, Record<string, unknown>> = { entropic: { max_iterations: 50 }, 'gradient-net': { steps: 2, hidden: 2, batch: 0, backend: 'cpu' } };
const PROTO_KEYS = Object.getOwnPropertyNames(Object.prototype).sort().join(',');

let cases = 0;
const tally = new Map<string, number>();
afterAll(() => {
  console.log(
    `fuzz (map JSON): ${cases} mutated maps; ${[...tally.entries()]
      .sort()
      .map(([k, v]) => `${k}: ${v}`)
      .join('; ')}`,
  );
});

/** One valid saved map per registered method and column count (fitted once, on small seeded-free data). */
const saved: { method: string; d: number; text: string }[] = [];
beforeAll(async () => {
  for (const spec of listMethods()) {
    for (const d of [1, 2]) {
      if (spec.name === 'ordinal' && d === 2) continue;
      const n = 12;
      const src = Array.from({ length: n }, (_, i) =>
        Array.from({ length: d }, (_, k) => ((i * (3 + k)) % n) + k * 0.5 + (spec.name === 'ordinal' ? 0 : i * 0.01)),
      );
      const tgt = Array.from({ length: n }, (_, i) =>
        Array.from({ length: d }, (_, k) => 2 * (((i * (5 + k)) % n) + (spec.name === 'ordinal' ? 0 : 0.3 * k)) + 1),
      );
      const map = await fitMap(spec.name, sample(src), sample(tgt), SMALL[spec.name] ?? {});
      saved.push({ method: spec.name, d, text: JSON.stringify(map.toJSON()) });
      map.dispose();
    }
  }
});

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/** Paths to every value in a JSON tree. */
function paths(v: Json, at: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(at);
  if (Array.isArray(v)) v.forEach((x, i) => paths(x, [...at, i], out));
  else if (v !== null && typeof v === 'object') for (const k of Object.keys(v)) paths(v[k], [...at, k], out);
  return out;
}

function getAt(root: Json, path: (string | number)[]): Json {
  let v: Json = root;
  for (const p of path) v = (v as Record<string | number, Json>)[p];
  return v;
}

function setAt(root: Json, path: (string | number)[], value: Json | undefined): Json {
  if (path.length === 0) return value === undefined ? null : value;
  const parent = getAt(root, path.slice(0, -1)) as Record<string | number, Json>;
  const key = path[path.length - 1];
  if (value === undefined) {
    if (Array.isArray(parent)) parent.splice(key as number, 1);
    else delete parent[key];
  } else parent[key] = value;
  return root;
}

/** Replacement values: wrong types, huge and tiny numbers, long arrays, hostile objects. */
const replacement: fc.Arbitrary<Json | undefined> = fc.oneof(
  fc.constant(undefined),
  fc.constantFrom<Json>(
    null,
    true,
    false,
    0,
    -1,
    0.5,
    1e300,
    -1e300,
    1e-300,
    2 ** 31,
    2 ** 53,
    1.5,
    '',
    'x',
    'quantile',
    'linear',
    [],
    {},
    [1],
    [1, 2, 3],
    [[1]],
    { a: 1 },
    [null],
    ['1'],
  ),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -3, max: 100 }),
  fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { maxLength: 30 }),
);

/** A mutation of a saved map's text. */
const mutation = fc.record({
  pick: fc.nat(),
  kind: fc.constantFrom('replace', 'replace', 'replace', 'grow', 'shrink', 'swap', 'scale', 'text-number', 'hostile-key', 'truncate', 'garble', 'retag'),
  value: replacement,
  factor: fc.constantFrom(-1, 0, 1e-300, 1e300, 1e308, 1 + 1e-15, 2),
  cut: fc.nat(),
  key: fc.constantFrom('__proto__', 'constructor', 'prototype', '\\u005f_proto__'),
  method: fc.constantFrom('quantile', 'step', 'ordinal', 'linear', 'pairs', 'entropic', 'gradient-net', 'auto'),
});

type Mutation = typeof mutation extends fc.Arbitrary<infer T> ? T : never;

function mutate(text: string, m: Mutation): string {
  if (m.kind === 'truncate') return text.slice(0, m.cut % text.length);
  if (m.kind === 'garble') {
    const i = m.cut % text.length;
    return text.slice(0, i) + '}{"],1e999'[m.pick % 10] + text.slice(i + 1);
  }
  if (m.kind === 'text-number') {
    // a number written as 1e999 (parses to Infinity) somewhere
    const nums = [...text.matchAll(/-?\d+(\.\d+)?(e[+-]?\d+)?/gi)];
    if (nums.length === 0) return text;
    const hit = nums[m.pick % nums.length];
    return text.slice(0, hit.index) + (m.cut % 2 ? '1e999' : '-1e999') + text.slice((hit.index ?? 0) + hit[0].length);
  }
  if (m.kind === 'hostile-key') {
    const i = text.indexOf('{', 1 + (m.cut % Math.max(1, text.length - 2)));
    const at = i < 0 ? 0 : i;
    return text.slice(0, at + 1) + `"${m.key}":{"polluted":true},` + text.slice(at + 1);
  }
  const root = JSON.parse(text) as Json;
  if (m.kind === 'retag') return JSON.stringify({ ...(root as object), method: m.method });
  const all = paths(root);
  const path = all[m.pick % all.length];
  const here = getAt(root, path);
  switch (m.kind) {
    case 'grow':
      if (Array.isArray(here)) here.push(here.length > 0 ? here[here.length - 1] : 0);
      else setAt(root, path, m.value);
      break;
    case 'shrink':
      if (Array.isArray(here)) here.pop();
      else setAt(root, path, undefined);
      break;
    case 'swap':
      if (Array.isArray(here) && here.length > 1) [here[0], here[here.length - 1]] = [here[here.length - 1], here[0]];
      break;
    case 'scale':
      if (typeof here === 'number') setAt(root, path, here * m.factor);
      else if (Array.isArray(here))
        setAt(
          root,
          path,
          here.map((x) => (typeof x === 'number' ? x * m.factor : x)),
        );
      break;
    default:
      setAt(root, path, m.value);
  }
  return JSON.stringify(root);
}

/** Runs a step; a RemapError is a fine answer, anything else thrown fails. Returns undefined on RemapError. */
function step<T>(what: string, f: () => T): T | undefined {
  try {
    return f();
  } catch (e) {
    if (isRemapError(e)) return undefined;
    throw new Error(`${what}: a raw exception: ${(e as Error)?.stack ?? String(e)}`);
  }
}

/** The largest size of any number in a JSON text. */
function largest(text: string): number {
  let m = 0;
  for (const hit of text.matchAll(/-?\d+(\.\d+)?(e[+-]?\d+)?/gi)) m = Math.max(m, Math.abs(Number(hit[0])));
  return m;
}

/**
 * Outputs must be finite, except where the saved parameters were made huge (beyond 1e150,
 * where products overflow): there the cells must show #NUM! errors, never the number.
 */
function checkFinite(mapped: Mapped, what: string, text: string): void {
  if (mapped.data.every((v) => Number.isFinite(v))) return;
  if (largest(text) <= 1e150)
    throw new Error(`${what}: a loaded map gave ${mapped.data.find((v) => !Number.isFinite(v))} from parameters no ` + `larger than 1e150`);
  const layout = readValues(
    Array.from({ length: mapped.n }, (_, i) => Array.from({ length: mapped.d }, () => i)),
    mapped.d,
    'fuzz',
  ).layout;
  for (const row of writeValues(mapped, layout))
    for (const c of row) if (typeof c === 'number' && !Number.isFinite(c)) throw new Error(`${what}: a cell would show ${c}`);
  tally.set('overflow shown as #NUM!', (tally.get('overflow shown as #NUM!') ?? 0) + 1);
}

describe('saved maps under mutation', () => {
  test('every mutated map JSON is refused with a RemapError or loads to a map whose outputs are finite', async () => {
    await assertProperty(
      fc.asyncProperty(fc.nat(), mutation, async (which, m) => {
        cases++;
        const base = saved[which % saved.length];
        const text = mutate(base.text, m);
        const json = step('parseMapJSON', () => parseMapJSON(text));
        if (!json) return void tally.set('refused by parseMapJSON', (tally.get('refused by parseMapJSON') ?? 0) + 1);
        const map: TransportMap | undefined = step('fromJSON', () => restoreMap(json));
        if (Object.getOwnPropertyNames(Object.prototype).sort().join(',') !== PROTO_KEYS || ({} as Record<string, unknown>).polluted !== undefined)
          throw new Error('Object.prototype changed');
        if (!map) return void tally.set('refused by fromJSON', (tally.get('refused by fromJSON') ?? 0) + 1);
        tally.set('loaded', (tally.get('loaded') ?? 0) + 1);
        try {
          const d = map.d;
          // points inside and around the fitted range of the original data (0..25)
          const xs = points(Array.from({ length: 6 }, (_, i) => Array.from({ length: d }, (_, k) => [-3, 0, 4.5, 11, 24, 40][(i + k) % 6])));
          const applied = step('apply', () => map.apply(xs));
          if (applied) checkFinite(applied, 'apply', text);
          const inverted = step('invert', () => map.invert(xs));
          if (inverted) checkFinite(inverted, 'invert', text);
          const diag = step('diagnostics', () => map.diagnostics());
          if (diag) {
            for (const [label, v] of reportTable(diag)) {
              if (typeof label !== 'string') throw new Error('a report label is not text');
              if (!['number', 'string', 'boolean'].includes(typeof v)) throw new Error(`report row "${label}" holds ${JSON.stringify(v)}`);
              if (typeof v === 'number' && !Number.isFinite(v)) throw new Error(`report row "${label}" is ${v}`);
            }
          }
          step('toJSON', () => JSON.stringify(map.toJSON()));
        } finally {
          map.dispose();
        }
      }),
      3000,
      15_000,
    );
  });
});
