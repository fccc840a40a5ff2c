/**
 * parseMapJSON / checkMapJSON (src/engine/map-json.ts) and each registered method's fromJSON:
 * saved maps are read as data only, size-capped, schema-checked, with every number finite and
 * no key that could reach a prototype; damaged text is refused with a RemapError that says
 * to give the text Remap wrote.
 * Source: common practice (defensive parsing of untrusted JSON); no computed numbers are expected here
 * beyond bit-identical round trips.
 */
import { RemapError } from '../../src/engine/errors';
import { checkMapJSON, MAX_MAP_JSON_CHARS, parseMapJSON } from '../../src/engine/map-json';
import type { MapJSON } from '../../src/engine/map';
import { fitMap, listMethods, restoreMap } from '../../src/engine/methods';
import { column, points, sample } from '../../src/engine/points';

const SMALL: Record<string, Record<string, unknown>> = { entropic: { max_iterations: 50 }, 'gradient-net': { steps: 2, hidden: 2, batch: 0, backend: 'cpu' } };

async function savedText(method = 'quantile', d = 1): Promise<string> {
  const n = 12;
  const src = Array.from({ length: n }, (_, i) => Array.from({ length: d }, (_, k) => ((i * (3 + k)) % n) + (method === 'ordinal' ? 0 : 0.01 * i + 0.5 * k)));
  const tgt = Array.from({ length: n }, (_, i) => Array.from({ length: d }, (_, k) => 2 * ((i * (5 + k)) % n) + 1 + (method === 'ordinal' ? 0 : 0.3 * k)));
  const map = await fitMap(method, sample(src), sample(tgt), SMALL[method] ?? {});
  const text = JSON.stringify(map.toJSON());
  map.dispose();
  return text;
}

function refusal(f: () => unknown): RemapError {
  try {
    f();
  } catch (e) {
    if (e instanceof RemapError) return e;
    throw new Error(`expected a RemapError, got ${(e as Error)?.stack ?? String(e)}`);
  }
  throw new Error('expected a RemapError, but the text was accepted');
}

const loads = (text: string) => restoreMap(parseMapJSON(text));

describe('parseMapJSON reads saved maps as data and checks them', () => {
  test('a saved map of every registered method loads back to a map with bit-identical outputs', async () => {
    for (const spec of listMethods()) {
      const d = spec.name === 'ordinal' ? 1 : 2;
      const text = await savedText(spec.name, d);
      const a = loads(text);
      const b = loads(text);
      const x = spec.name === 'pairs' ? points(JSON.parse(text).params.source) : points([Array.from({ length: d }, (_, k) => 3 + k)]);
      const ya = a.apply(x).data;
      const yb = b.apply(x).data;
      expect(ya.length).toBe(yb.length);
      ya.forEach((v, i) => expect(Object.is(v, yb[i])).toBe(true));
      expect(JSON.stringify(a.toJSON())).toBe(JSON.stringify(b.toJSON()));
      a.dispose();
      b.dispose();
    }
  });

  test('text longer than MAX_MAP_JSON_CHARS is refused before it is parsed', () => {
    const spy = jest.spyOn(JSON, 'parse');
    const e = refusal(() => parseMapJSON(' '.repeat(MAX_MAP_JSON_CHARS + 1)));
    expect(e.message).toMatch(/limit/);
    expect(spy).not.toHaveBeenCalled();
    spy.mockRestore();
  });

  test('text that is not a string, truncated or garbled JSON is refused with a message naming REMAP.SAVE', async () => {
    const text = await savedText();
    expect(refusal(() => parseMapJSON(42 as unknown as string)).message).toMatch(/REMAP\.SAVE/);
    for (const bad of [text.slice(0, text.length - 1), text.slice(0, 20), text.replace(':', ''), '', '{', 'null', '[]', '"remap.map"', text + 'x']) {
      const e = refusal(() => loads(bad));
      expect(e.message).toMatch(/REMAP\.SAVE|remap fit/);
      expect(e.message.length).toBeGreaterThan(20);
    }
  });

  test('numbers too large to be finite (1e999) are refused wherever they are', async () => {
    const text = await savedText('linear', 2);
    for (const field of ['"w2Squared":', '"mean1":[', '"n":{"source":']) {
      const i = text.indexOf(field) + field.length;
      const bad = text.slice(0, i) + '1e999' + text.slice(i).replace(/^-?[\d.e+-]+/, '');
      expect(refusal(() => loads(bad)).message).toMatch(/finite|count|REMAP\.SAVE/);
    }
  });

  test('keys __proto__, constructor and prototype are refused (also written with escapes), and Object.prototype is unchanged', async () => {
    const text = await savedText();
    const before = Object.getOwnPropertyNames(Object.prototype).sort().join(',');
    for (const key of ['__proto__', 'constructor', 'prototype', '\\u005f_proto__', 'c\\u006fnstructor']) {
      for (const at of [1, text.indexOf('"params":{') + 10, text.indexOf('"settings":{') + 12]) {
        const bad = text.slice(0, at) + `"${key}":{"polluted":true,"toString":1},` + text.slice(at);
        expect(refusal(() => loads(bad)).message).toMatch(/forbidden key/);
      }
    }
    expect(Object.getOwnPropertyNames(Object.prototype).sort().join(',')).toBe(before);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  test('text is never evaluated as code: a function-like or script-like value is only text and is refused by the schema', async () => {
    const text = await savedText();
    const g = globalThis as Record<string, unknown>;
    delete g.remapPwned;
    for (const payload of [
      '"(() => { globalThis.remapPwned = 1 })()"',
      '"<script>remapPwned=1</script>"',
      '"constructor.constructor(\'globalThis.remapPwned=1\')()"',
    ]) {
      const bad = text.replace('"format":"remap.map"', `"format":${payload}`);
      refusal(() => loads(bad));
      const bad2 = text.replace(/"xs":\[[^\]]*\]/, `"xs":${payload}`);
      refusal(() => loads(bad2));
    }
    expect(g.remapPwned).toBeUndefined();
  });

  test('the envelope is schema-checked: format, version, method, d, settings, columns, n, dropped, fitted', async () => {
    const base = JSON.parse(await savedText()) as Record<string, unknown>;
    const cases: [string, unknown][] = [
      ['format', 'other'],
      ['version', 2],
      ['method', 'wibble'],
      ['method', '__proto__'],
      ['d', 0],
      ['d', 1.5],
      ['d', '1'],
      ['settings', []],
      ['settings', { tails: { x: 1 } }],
      ['columns', ['a', 'b']],
      ['columns', [1]],
      ['n', { source: -1, target: 3 }],
      ['dropped', { source: 0 }],
      ['fitted', null],
      ['fitted', { cost: { w2Squared: 1 }, warnings: [] }],
      ['fitted', { ...(base.fitted as object), cost: { ...((base.fitted as Record<string, unknown>).cost as object), kind: 'guess' } }],
      ['fitted', { ...(base.fitted as object), cost: { ...((base.fitted as Record<string, unknown>).cost as object), w2Squared: -1 } }],
      ['fitted', { ...(base.fitted as object), energyBefore: [1, 2] }],
      ['fitted', { ...(base.fitted as object), warnings: [1] }],
      ['fitted', { ...(base.fitted as object), warnings: [{ code: 'ties', message: {} }] }],
      ['fitted', { ...(base.fitted as object), convergence: { iterations: 'many' } }],
    ];
    for (const [field, value] of cases) {
      const e = refusal(() => checkMapJSON({ ...base, [field]: value }));
      expect(e.message).toMatch(/REMAP\.SAVE|remap fit/);
    }
    expect(refusal(() => checkMapJSON(Object.assign(Object.create({ evil: 1 }), base))).message).toMatch(/top level/);
  });

  test('JSON nested deeper than a saved map can be is refused, not overflowing the stack', async () => {
    const text = await savedText();
    const deep = text.replace('"params":{', '"params":{"x":' + '['.repeat(5000) + ']'.repeat(5000) + ',');
    refusal(() => loads(deep));
  });

  test("each registered method's fromJSON refuses params of the wrong length or type", async () => {
    for (const spec of listMethods()) {
      const d = spec.name === 'ordinal' ? 1 : 2;
      const json = JSON.parse(await savedText(spec.name, d)) as MapJSON & { params: Record<string, unknown> };
      const variants: unknown[] = [null, [], 'params', 7, {}];
      // every array field in params: one entry short, one entry too many, a text entry, a null entry
      const walk = (v: unknown, path: string[]): void => {
        if (Array.isArray(v)) {
          const set = (x: unknown) => variants.push(setPath(json.params, path, x));
          if (v.length > 0) set(v.slice(1));
          set([...v, v.length > 0 ? v[v.length - 1] : 0]);
          set(v.map((x, i) => (i === 0 ? 'x' : x)));
          set(v.map((x, i) => (i === v.length - 1 ? null : x)));
          if (v.length > 0 && Array.isArray(v[0])) walk(v[0], [...path, '0']);
        } else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) walk(x, [...path, k]);
      };
      walk(json.params, []);
      let refused = 0;
      for (const params of variants) {
        try {
          const m = restoreMap(checkMapJSON(JSON.parse(JSON.stringify({ ...json, params }))));
          // accepted: it must still map to finite numbers or refuse with a RemapError
          try {
            const out = m.apply(points([Array.from({ length: d }, () => 2)]));
            expect(Array.from(out.data).every(Number.isFinite)).toBe(true);
          } catch (e) {
            expect(e).toBeInstanceOf(RemapError);
          }
          m.dispose();
        } catch (e) {
          if (!(e instanceof RemapError)) throw new Error(`${spec.name}: a raw exception for damaged params: ${(e as Error)?.stack}`);
          refused++;
        }
      }
      // Source: common practice: every structural damage of params (wrong type, length or entry) is refused
      expect({ method: spec.name, refused }).toEqual({ method: spec.name, refused: variants.length });
    }
  });

  test('a quantile map restored from JSON maps like the fitted one, bit for bit', async () => {
    const fitted = await fitMap('quantile', sample([3, 1, 2, 8, 5]), sample([10, 40, 20, 30, 90]));
    const restored = loads(JSON.stringify(fitted.toJSON()));
    const x = column([0, 1, 2.5, 4, 8, 100]);
    const a = fitted.apply(x).data;
    const b = restored.apply(x).data;
    a.forEach((v, i) => expect(Object.is(v, b[i])).toBe(true));
  });
});

function setPath(root: unknown, path: string[], value: unknown): unknown {
  const copy = JSON.parse(JSON.stringify(root)) as Record<string, unknown>;
  if (path.length === 0) return value;
  let o: Record<string, unknown> = copy;
  for (const p of path.slice(0, -1)) o = o[p] as Record<string, unknown>;
  o[path[path.length - 1]] = value;
  return copy;
}
