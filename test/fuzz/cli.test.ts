/**
 * Property-based tests of every `remap` command, run in-process through `main` over an
 * in-memory file system: hostile CSV files (blanks, text, TRUE, NaN and Infinity spellings,
 * magnitudes from 1e-300 to 1e300, duplicated rows, constant columns, ragged lines, broken
 * quoting), odd flags, methods and settings. Contract: exit code 0, 1 or 2; on failure
 * exactly one stderr line, starting "remap: ", with no stack trace and saying what to do;
 * on success, every number written is finite.
 * Source: common practice (property-based robustness testing); no expected numbers here.
 */
import fc from 'fast-check';
import { parseCSV } from '../../src/cli/csv';
import { listMethods } from '../../src/engine/methods';
import { anyNumber, assertProperty, saysWhatToDo, scaledNumber, shape } from './arbitraries';
import { runCli as run } from '../helpers/run-cli';

const SLOW = new Set(['entropic', 'gradient-net']);
const FAST = listMethods()
  .map((m) => m.name)
  .filter((n) => !SLOW.has(n));

let cases = 0;
const tally = new Map<string, number>();
const requirementOnly = new Map<string, string>();
const dbg = new Map<string, number>();
afterAll(() => {
  console.log(
    `fuzz (command line): ${cases} cases run; exit codes: ${[...tally.entries()]
      .sort()
      .map(([k, v]) => `${k}: ${v}`)
      .join('; ')}`,
  );
  if (process.env.FUZZ_DEBUG)
    console.log(
      [...dbg.entries()]
        .sort((a, b) => b[1] - a[1])
        .slice(0, 25)
        .map(([k, v]) => `${v} ${k}`)
        .join('\n'),
    );
  if (requirementOnly.size > 0) console.log(`messages that only state a requirement (review their wording):\n${[...requirementOnly.values()].join('\n')}`);
});

/** A CSV field: a number written as JavaScript or a person would, a blank, text, or a non-finite spelling. */
const field: fc.Arbitrary<string> = fc.oneof(
  { arbitrary: anyNumber.map(String), weight: 12 },
  { arbitrary: fc.integer({ min: -9, max: 9 }).map(String), weight: 6 },
  { arbitrary: fc.constantFrom('', ' ', 'x', 'TRUE', 'NaN', 'inf', '-Infinity', '1e999', '"a,b"', '"q""uote"', '1,5', '#N/A', '0x10', '1_000'), weight: 2 },
);

/** A CSV file: a header, rows; sometimes duplicated rows, a constant column, a ragged line or an unclosed quote. */
function csv(cols: readonly string[]): fc.Arbitrary<string> {
  const d = cols.length;
  return fc
    .record({
      exp: fc.oneof({ arbitrary: fc.integer({ min: -6, max: 6 }), weight: 4 }, { arbitrary: fc.integer({ min: -300, max: 299 }), weight: 1 }),
      clean: fc.constantFrom(true, true, true, false),
      rows: fc.integer({ min: 0, max: 10 }).map((n) => (n < 2 ? n : n + 2)),
      damage: fc.constantFrom('none', 'none', 'none', 'none', 'none', 'none', 'none', 'none', 'dupe', 'constant', 'ragged', 'quote', 'bom-crlf', 'empty'),
    })
    .chain((o) => {
      const f = o.clean ? scaledNumber(o.exp).map(String) : field;
      return fc.array(fc.array(f, { minLength: d, maxLength: d }), { minLength: o.rows, maxLength: o.rows }).map((rows) => {
        let body = rows.map((r) => [...r]);
        if (o.damage === 'dupe') body = [...body, ...body];
        if (o.damage === 'constant') for (const r of body) r[0] = '3';
        if (o.damage === 'ragged' && body.length > 0) body[0] = body[0].slice(1);
        let text = [cols.join(','), ...body.map((r) => r.join(','))].join('\n') + '\n';
        if (o.damage === 'quote') text = text.replace(/,/, ',"');
        if (o.damage === 'bom-crlf') text = '\uFEFF' + text.replace(/\n/g, '\r\n');
        if (o.damage === 'empty') text = '';
        return text;
      });
    });
}

const flagValue = fc.oneof(
  fc.constantFrom('s.csv', 't.csv', 'm.json', 'x.csv', 'nope.csv', '', 'a', 'w', 'a,b', 'a,,b', '--source'),
  fc.string({ maxLength: 5 }),
);
const method = fc.oneof(
  { arbitrary: fc.constantFrom(...FAST, 'auto'), weight: 6 },
  { arbitrary: fc.constantFrom('', '__proto__', 'LINEAR', 'entropic;', 'x'), weight: 1 },
);
const settings = fc.constantFrom(
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  'tails=linear',
  'ridge=0.1',
  'ridge=-1',
  '=',
  'seed=7',
  '__proto__=1',
  'constructor=1',
  'bogus=1',
);

/** Checks one run: exit code and stderr discipline, and finite numbers on success. */
function judge(r: { code: number; out: string; err: string }, command: string, files: Record<string, string>): void {
  const key = `${command} ${r.code}`;
  tally.set(key, (tally.get(key) ?? 0) + 1);
  if (![0, 1, 2].includes(r.code)) throw new Error(`${command}: exit code ${r.code}`);
  if (/\n\s+at |Error: |TypeError|RangeError/.test(r.err)) throw new Error(`${command}: a stack trace or raw error on stderr: ${r.err}`);
  if (r.code !== 0) {
    if (process.env.FUZZ_DEBUG) dbg.set(shape(r.err), (dbg.get(shape(r.err)) ?? 0) + 1);
    const lines = r.err.split('\n');
    if (lines.length !== 2 || lines[1] !== '') throw new Error(`${command}: exit ${r.code} with ${lines.length - 1} stderr lines: ${JSON.stringify(r.err)}`);
    if (!lines[0].startsWith('remap: ') || lines[0].trim() === 'remap:') throw new Error(`${command}: stderr line ${JSON.stringify(lines[0])}`);
    if (/unexpected problem/.test(lines[0])) throw new Error(`${command}: an unexpected problem: ${lines[0]}`);
    const says = saysWhatToDo(lines[0]);
    if (says !== 'verb') requirementOnly.set(shape(lines[0]), lines[0]);
    if (says === false) throw new Error(`${command}: the message does not say what to do: ${lines[0]}`);
    return;
  }
  if (command === 'apply' || command === 'invert') {
    const text = r.out !== '' ? r.out : (files['y.csv'] ?? '');
    for (const row of parseCSV(text).slice(1)) for (const f of row) if (/^(nan|[+-]?inf)/i.test(f.trim())) throw new Error(`${command}: wrote ${f}`);
  }
  if (command === 'cost') {
    const j = JSON.parse(r.out) as { w2_squared: unknown; w2: unknown };
    if (typeof j.w2_squared !== 'number' || !Number.isFinite(j.w2_squared) || typeof j.w2 !== 'number' || !Number.isFinite(j.w2))
      throw new Error(`cost: non-finite cost ${r.out}`);
  }
  if (command === 'fit') {
    const text = files['m.json'];
    if (typeof text !== 'string' || !text.startsWith('{')) throw new Error('fit: exit 0 without writing the model');
  }
}

describe('remap command line under hostile input', () => {
  test('fit, cost, apply, invert, report, methods: exit 0/1/2, one stderr line that says what to do on failure, finite numbers on success', async () => {
    const arb = fc
      .record({
        cols: fc.constantFrom(['a'], ['a'], ['a', 'b'], ['a', 'b'], ['a', 'b', 'w'], ['a', 'a'], ['a', 'b', 'c']),
        tcols: fc.constantFrom('same', 'same', 'same', 'other'),
        command: fc.constantFrom('fit', 'cost', 'apply', 'invert', 'report', 'methods', 'fit-apply', 'fit-apply', 'fit-invert', 'bogus', ''),
        method,
        settings,
        columns: fc.constantFrom(undefined, undefined, undefined, undefined, undefined, 'a', 'a,b', 'b,a', 'zz', ','),
        weights: fc.constantFrom(undefined, undefined, undefined, undefined, undefined, undefined, 'w', 'a', 'zz'),
        tails: fc.constantFrom(undefined, undefined, undefined, 'linear', 'sideways'),
        seed: fc.constantFrom(undefined, undefined, undefined, undefined, '7', '-1', 'x'),
        extra: fc.oneof(
          { arbitrary: fc.constant([] as [string, string][]), weight: 3 },
          {
            arbitrary: fc.array(
              fc.tuple(fc.constantFrom('--source', '--target', '--model', '--out', '--bogus', '--columns', 'stray', '--method=quantile', '--seed'), flagValue),
              { maxLength: 2 },
            ),
            weight: 1,
          },
        ),
        model: fc.constantFrom('fitted', 'fitted', 'fitted', 'garbled', 'cut', 'missing'),
        cut: fc.nat(),
      })
      .chain((o) =>
        fc.record({
          o: fc.constant(o),
          s: csv(o.cols),
          t: csv(o.tcols === 'same' ? o.cols : ['b', 'c']),
          x: csv(o.cols),
        }),
      );
    await assertProperty(
      fc.asyncProperty(arb, async ({ o, s, t, x }) => {
        cases++;
        const files: Record<string, string> = { 's.csv': s, 't.csv': t, 'x.csv': x };
        const common = ['--source', 's.csv', '--target', 't.csv', '--method', o.method];
        if (o.settings !== undefined) common.push('--settings', o.settings);
        if (o.columns !== undefined) common.push('--columns', o.columns);
        if (o.weights !== undefined) common.push('--source-weights', o.weights);
        if (o.tails !== undefined) common.push('--tails', o.tails);
        if (o.seed !== undefined) common.push('--seed', o.seed);
        const extra = o.extra.flat();
        const mapCommand = o.command === 'fit-invert' ? 'invert' : 'apply';
        switch (o.command) {
          case 'fit':
            return judge(await run(['fit', ...common, '--out', 'm.json', ...extra], files), 'fit', files);
          case 'cost':
            return judge(await run(['cost', ...common, ...extra], files), 'cost', files);
          case 'methods':
            return judge(await run(['methods', ...extra], files), 'methods', files);
          case 'bogus':
          case '':
            return judge(await run([o.command, ...extra], files), 'usage', files);
          default: {
            // apply/invert/report on a model that was fitted, garbled, cut short or is missing
            const fitted = await run(['fit', ...common, '--out', 'm.json'], files);
            judge(fitted, 'fit', files);
            if (fitted.code !== 0 && o.model === 'fitted') return;
            if (files['m.json'] !== undefined) {
              if (o.model === 'garbled') files['m.json'] = files['m.json'].replace(/[0-9]/, '"');
              if (o.model === 'cut') files['m.json'] = files['m.json'].slice(0, o.cut % files['m.json'].length);
            }
            if (o.model === 'missing') delete files['m.json'];
            if (o.command === 'report') return judge(await run(['report', '--model', 'm.json', ...extra], files), 'report', files);
            return judge(
              await run([mapCommand, '--model', 'm.json', '--input', 'x.csv', ...(o.cut % 2 ? ['--out', 'y.csv'] : []), ...extra], files),
              mapCommand,
              files,
            );
          }
        }
      }),
      1000,
      15_000,
    );
  });

  test('clean files with every fast method: fit, cost, apply, invert and report succeed or fail with one line; numbers written are finite', async () => {
    const arb = fc
      .record({
        d: fc.integer({ min: 1, max: 3 }),
        method: fc.constantFrom(...FAST, 'auto'),
        tails: fc.constantFrom('clamp', 'linear'),
        exp: fc.integer({ min: -6, max: 6 }),
        far: fc.boolean(),
      })
      .chain((o) => {
        const cols = ['a', 'b', 'c'].slice(0, o.d);
        const rows = (min: number, max: number, scale: number) =>
          fc
            .array(
              fc.array(
                scaledNumber(o.exp).map((v) => v * scale),
                { minLength: o.d, maxLength: o.d },
              ),
              { minLength: min, maxLength: max },
            )
            .map((rs) => [cols.join(','), ...rs.map((r) => r.join(','))].join('\n') + '\n');
        return fc.record({ o: fc.constant(o), s: rows(5, 12, 1), t: rows(5, 12, 3), x: rows(0, 6, o.far ? 1e6 : 1) });
      });
    await assertProperty(
      fc.asyncProperty(arb, async ({ o, s, t, x }) => {
        cases++;
        // pairs maps its own source rows only, on equal sizes: give it the source as target and input
        const files: Record<string, string> = { 's.csv': s, 't.csv': o.method === 'pairs' ? s : t, 'x.csv': o.method === 'pairs' ? s : x };
        const common = ['--source', 's.csv', '--target', 't.csv', '--method', o.method, '--tails', o.tails];
        judge(await run(['cost', ...common], files), 'cost', files);
        const fitted = await run(['fit', ...common, '--out', 'm.json'], files);
        judge(fitted, 'fit', files);
        if (fitted.code !== 0) return;
        judge(await run(['apply', '--model', 'm.json', '--input', 'x.csv'], files), 'apply', files);
        judge(await run(['invert', '--model', 'm.json', '--input', 'x.csv', '--out', 'y.csv'], files), 'invert', files);
        judge(await run(['report', '--model', 'm.json'], files), 'report', files);
      }),
      300,
      12_000,
    );
  });
});
