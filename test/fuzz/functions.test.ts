/**
 * Property-based tests of every worksheet function (src/functions/functions.ts), called as
 * Excel calls them (with a CustomFunctions stub), over hostile ranges: blanks (null and ''),
 * text, logical values, error values, NaN and infinities, magnitudes from 1e-300 to 1e300,
 * duplicated rows, constant columns, single rows, mismatched shapes, ragged arrays, odd
 * weights, settings and method names. Contract: a function either returns a result whose
 * cells are finite numbers, blanks or per-cell errors, or throws the host's sheet error
 * with a message that says what to do; never a raw exception, never a mutated input.
 * Source: common practice (property-based robustness testing); no expected numbers here.
 */
import fc from 'fast-check';
import { listMethods } from '../../src/engine/methods';
import * as F from '../../src/functions/functions';
import { forgetAll, isHandle } from '../../src/fits';
import { installCustomFunctionsStub } from '../helpers/custom-functions-stub';
import { shape } from './arbitraries';
import { cleanRange, deepFreeze, errorCell, junkCell, oddMethod, oddSettings, assertProperty, range, sameDeep, snapshot, weights } from './arbitraries';
import { checkGrid, checkNumber, checkSheetError, outcome, vagueMessages, type Outcome } from './outcomes';

installCustomFunctionsStub();

const SLOW = new Set(['entropic', 'gradient-net']);
const FAST = listMethods()
  .map((m) => m.name)
  .filter((n) => !SLOW.has(n));
const SLOW_PRESENT = listMethods()
  .map((m) => m.name)
  .filter((n) => SLOW.has(n));
/** Small settings so the slow methods finish in well under a second on tiny data. */
const SLOW_SETTINGS: Record<string, string> = { entropic: 'max_iterations=50', 'gradient-net': 'steps=2; hidden=2; batch=0; time_budget=5; backend=cpu' };

let cases = 0;
/** How often each function gave a result or each error code, so a run shows both paths were exercised. */
const tally = new Map<string, number>();
const shapes = new Map<string, number>();
afterAll(() => {
  forgetAll();

  console.log(
    `fuzz (worksheet functions): ${cases} cases run over ${listMethods().length} methods (${listMethods()
      .map((m) => m.name)
      .join(', ')})`,
  );
  if (process.env.FUZZ_DEBUG)
    console.log(
      [...shapes.entries()]
        .sort((a, b) => b[1] - a[1])
        .slice(0, 40)
        .map(([k, v]) => `${v} ${k}`)
        .join('\n'),
    );
  console.log(
    `outcomes: ${[...tally.entries()]
      .sort()
      .map(([k, v]) => `${k}: ${v}`)
      .join('; ')}`,
  );
  if (vagueMessages.size > 0) console.log(`messages that only state a requirement (review their wording):\n${[...vagueMessages.values()].join('\n')}`);
});

const methodArg: fc.Arbitrary<unknown> = fc.oneof({ arbitrary: fc.constantFrom(...FAST), weight: 6 }, { arbitrary: oddMethod, weight: 1 });
/** Mostly no settings or good ones, so that fits get far enough to meet the hostile data. */
const settingsArg: fc.Arbitrary<unknown> = fc.oneof(
  { arbitrary: fc.constant(undefined), weight: 4 },
  { arbitrary: fc.constantFrom('tails=linear', 'tails=clamp'), weight: 2 },
  { arbitrary: oddSettings, weight: 1 },
);
/** Mostly no weights. */
const weightsArg = (rows: number): fc.Arbitrary<unknown> => fc.oneof({ arbitrary: fc.constant(undefined), weight: 2 }, { arbitrary: weights(rows), weight: 1 });

/** Checks the outcome of one call; `kind` says what a result must look like. */
function judge(o: Outcome, fn: string, kind: 'grid' | 'number' | 'handle' | 'json' | 'report' | 'pairs'): void {
  const key = `${fn} ${o.kind === 'error' ? o.code : 'result'}`;
  tally.set(key, (tally.get(key) ?? 0) + 1);
  if (process.env.FUZZ_DEBUG && o.kind === 'error') shapes.set(shape(o.message), (shapes.get(shape(o.message)) ?? 0) + 1);
  if (o.kind === 'error') return checkSheetError(o.code, o.message, fn);
  const v = o.value;
  switch (kind) {
    case 'grid':
      return checkGrid(v, fn);
    case 'pairs':
      return checkGrid(v, fn, true);
    case 'number':
      return checkNumber(v, fn);
    case 'handle':
      if (typeof v !== 'string' || !isHandle(v)) throw new Error(`${fn}: result ${JSON.stringify(v)} is not a handle`);
      return;
    case 'json':
      if (typeof v !== 'string') throw new Error(`${fn}: result is not text`);
      JSON.parse(v);
      return;
    case 'report':
      checkGrid(v, fn, true);
      for (const row of v as unknown[][]) if (row.length !== 2 || typeof row[0] !== 'string') throw new Error(`${fn}: a report row is not (label, value)`);
      return;
  }
}

/** Calls f on frozen inputs and checks that nothing was changed. */
async function frozenCall(args: unknown[], f: (...a: unknown[]) => unknown): Promise<Outcome> {
  const before = snapshot(args);
  deepFreeze(args);
  const o = await outcome(() => f(...args));
  if (!sameDeep(before, snapshot(args))) throw new Error('an input was changed');
  return o;
}

describe('worksheet functions under hostile input', () => {
  test('VALUES, COST, FIT and PAIRS: a result of finite numbers, blanks or per-cell errors, or a sheet error that says what to do', async () => {
    const arb = fc
      .record({
        d: fc.integer({ min: 1, max: 3 }),
        dt: fc.constantFrom(0, 0, 0, 0, 0, 0, 0, 0, 1, -1),
        which: fc.constantFrom('values', 'cost', 'fit', 'pairs'),
      })
      .chain(({ d, dt, which }) =>
        fc.record({
          which: fc.constant(which),
          source: range(d),
          target: range(Math.max(1, d + dt)),
          values: fc.oneof(range(d, { maxRows: 6 }), junkCell, fc.constant([] as unknown[])),
          method: methodArg,
          settings: settingsArg,
          sw: weightsArg(12),
          tw: weightsArg(12),
          output: fc.constantFrom(undefined, 'values', 'index', 'INDEX', 'x', 3),
        }),
      )
      .map((r) =>
        r.which === 'pairs' && r.target.length % 2 === 0
          ? { ...r, target: r.source.map((row) => (Array.isArray(row) ? row.map((v) => (typeof v === 'number' ? -v : v)) : row)) }
          : r,
      )
      .chain((r) =>
        // weights of the sample's own height most of the time
        fc
          .record({ sw: fc.oneof(fc.constant(r.sw), weightsArg(r.source.length)), tw: fc.oneof(fc.constant(r.tw), weightsArg(r.target.length)) })
          .map((w) => ({ ...r, ...w })),
      );
    await assertProperty(
      fc.asyncProperty(arb, async (r) => {
        cases++;
        switch (r.which) {
          case 'values':
            return judge(await frozenCall([r.values, r.source, r.target, r.method, r.settings, r.sw, r.tw], F.values as never), 'VALUES', 'grid');
          case 'cost':
            return judge(await frozenCall([r.source, r.target, r.method, r.settings, r.sw, r.tw], F.cost as never), 'COST', 'number');
          case 'fit':
            return judge(await frozenCall([r.source, r.target, r.method, r.settings, r.sw, r.tw], F.fit as never), 'FIT', 'handle');
          default:
            return judge(await frozenCall([r.source, r.target, r.output], F.pairs as never), 'PAIRS', 'pairs');
        }
      }),
      1200,
      15_000,
    );
  });

  test('VALUES on clean numbers with every fast method: every mapped cell is a finite number (or a per-cell error), the shape is kept', async () => {
    const arb = fc
      .record({
        d: fc.integer({ min: 1, max: 3 }),
        method: fc.constantFrom(...FAST, 'auto', ''),
        tails: fc.constantFrom('', 'tails=linear', 'tails=clamp'),
      })
      .chain((o) =>
        fc.record({
          o: fc.constant(o),
          source: cleanRange(o.d, 1, 10),
          target: cleanRange(o.d, 1, 10),
          values: cleanRange(o.d, 0, 5),
        }),
      );
    await assertProperty(
      fc.asyncProperty(arb, async ({ o, source, target, values }) => {
        cases++;
        const vals = o.method === 'pairs' ? source : values;
        const tgt = o.method === 'pairs' ? source.map((row) => row.map((v) => 2 * v - 1)) : target;
        judge(await frozenCall([source, tgt, o.method, o.tails], F.cost as never), 'COST', 'number');
        judge(await frozenCall([source, tgt, o.method, o.tails], F.fit as never), 'FIT', 'handle');
        const r = await frozenCall([vals, source, tgt, o.method, o.tails], F.values as never);
        judge(r, 'VALUES', 'grid');
        if (r.kind === 'value') {
          const g = r.value as unknown[][];
          if (g.length !== vals.length || g.some((row) => row.length !== o.d)) throw new Error('VALUES changed the shape of values');
        }
      }),
      600,
      10_000,
    );
  });

  test('GAUSSCOST: a finite number or a sheet error that says what to do', async () => {
    const block = (r: number, c: number) =>
      fc.array(
        fc.array(
          fc.oneof(
            { arbitrary: fc.double({ min: -5, max: 5, noNaN: true }), weight: 30 },
            { arbitrary: junkCell, weight: 1 },
            { arbitrary: fc.constantFrom(1e300, 1e-300, -1e300, 1e154), weight: 1 },
          ),
          { minLength: c, maxLength: c },
        ),
        { minLength: r, maxLength: r },
      );
    const arb = fc.integer({ min: 1, max: 3 }).chain((d) =>
      fc.record({
        m1: fc.oneof({ arbitrary: block(d, 1), weight: 4 }, { arbitrary: block(1, d), weight: 4 }, { arbitrary: block(d + 1, 1), weight: 1 }),
        c1: fc.oneof(
          { arbitrary: block(d, d), weight: 1 },
          {
            arbitrary: block(d, d).map((m) =>
              m.map((row, i) => row.map((v, j) => (i === j ? (typeof v === 'number' ? 1 + Math.abs(v) : v) : 0.1 * ((i + j) % 3)))),
            ),
            weight: 6,
          },
          { arbitrary: block(d, d + 1), weight: 1 },
        ),
        m2: fc.oneof({ arbitrary: block(d, 1), weight: 4 }, { arbitrary: block(1, d), weight: 4 }, { arbitrary: errorCell, weight: 1 }),
        c2: fc.oneof(
          { arbitrary: block(d, d).map((m) => m.map((row, i) => row.map((v, j) => (i === j ? Math.abs(Number(v)) || 1 : 0)))), weight: 6 },
          { arbitrary: block(d, d), weight: 1 },
        ),
      }),
    );
    await assertProperty(
      fc.asyncProperty(arb, async ({ m1, c1, m2, c2 }) => {
        cases++;
        judge(await frozenCall([m1, c1, m2, c2], F.gausscost as never), 'GAUSSCOST', 'number');
      }),
      600,
      6_000,
    );
  });

  test('APPLY, INVERT, REPORT, SAVE and LOAD on fitted maps, unknown handles and damaged JSON', async () => {
    const arb = fc
      .record({
        d: fc.integer({ min: 1, max: 3 }),
        method: fc.constantFrom(...FAST),
        settings: fc.constantFrom(undefined, 'tails=linear'),
        which: fc.constantFrom('apply', 'invert', 'report', 'save', 'load'),
        model: fc.constantFrom('handle', 'handle', 'json', 'cut-json', 'unknown-handle', 'junk'),
        junk: fc.oneof(junkCell, fc.string({ maxLength: 20 }), fc.constant([[null]])),
        cut: fc.nat(),
      })
      .chain((o) => fc.record({ o: fc.constant(o), source: cleanRange(o.d, 4, 10), target: cleanRange(o.d, 4, 10), values: range(o.d, { maxRows: 6 }) }));
    await assertProperty(
      fc.asyncProperty(arb, async ({ o, source, target, values }) => {
        cases++;
        const target2 = o.method === 'pairs' ? source.map((r) => r.map((v) => v * 2 + 1)) : target;
        const fitted = await outcome(() => F.fit(source as never, target2 as never, o.method, o.settings));
        if (fitted.kind === 'error') return checkSheetError(fitted.code, fitted.message, 'FIT');
        const handle = fitted.value as string;
        let model: unknown = handle;
        if (o.model !== 'handle') {
          const saved = await outcome(() => F.save(handle));
          if (saved.kind === 'error') return checkSheetError(saved.code, saved.message, 'SAVE');
          const json = saved.value as string;
          model =
            o.model === 'json'
              ? json
              : o.model === 'cut-json'
                ? json.slice(0, o.cut % json.length)
                : o.model === 'unknown-handle'
                  ? handle.replace(/[0-9a-f]$/, (c) => (c === '0' ? '1' : '0'))
                  : o.junk;
        }
        const vals = o.method === 'pairs' && o.which === 'apply' ? source : values;
        switch (o.which) {
          case 'apply':
            return judge(await frozenCall([model, vals], F.apply as never), 'APPLY', 'grid');
          case 'invert':
            return judge(await frozenCall([model, vals], F.invert as never), 'INVERT', 'grid');
          case 'report':
            return judge(await frozenCall([model], F.report as never), 'REPORT', 'report');
          case 'save':
            return judge(await frozenCall([model], F.save as never), 'SAVE', 'json');
          default:
            return judge(await frozenCall([model], F.load as never), 'LOAD', 'handle');
        }
      }),
      600,
      12_000,
    );
  });

  const slowTest = SLOW_PRESENT.length > 0 ? test : test.skip;
  slowTest(
    `slow methods (${SLOW_PRESENT.join(', ') || 'none registered'}) on tiny hostile data: results finite or sheet errors that say what ` + `to do`,
    async () => {
      const arb = fc
        .record({
          d: fc.integer({ min: 1, max: 2 }),
          method: fc.constantFrom(...SLOW_PRESENT),
          which: fc.constantFrom('values', 'cost'),
          junk: fc.constantFrom(0, 0.2),
        })
        .chain((o) =>
          fc.record({
            o: fc.constant(o),
            source: fc.oneof({ arbitrary: cleanRange(o.d, 10, 14), weight: 3 }, { arbitrary: range(o.d, { minRows: 2, maxRows: 14 }), weight: 1 }),
            target: fc.oneof({ arbitrary: cleanRange(o.d, 10, 14), weight: 3 }, { arbitrary: range(o.d, { minRows: 2, maxRows: 14 }), weight: 1 }),
            values: range(o.d, { maxRows: 4 }),
            sw: weights(12),
          }),
        );
      await assertProperty(
        fc.asyncProperty(arb, async ({ o, source, target, values, sw }) => {
          cases++;
          const settings = SLOW_SETTINGS[o.method];
          const w = Array.isArray(sw) && sw.length === source.length && o.junk > 0 ? sw : undefined;
          if (o.which === 'values') judge(await frozenCall([values, source, target, o.method, settings, w], F.values as never), `VALUES (${o.method})`, 'grid');
          else judge(await frozenCall([source, target, o.method, settings, w], F.cost as never), `COST (${o.method})`, 'number');
        }),
        30,
        20_000,
      );
    },
  );
});
