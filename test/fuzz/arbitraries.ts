/* Shared generators and checks for the property-based tests in test/fuzz (fast-check 4).
 * Sizes are bounded so that no property can run long; every property also stops
 * after its time limit (fast-check's interruptAfterTimeLimit), and then fails
 * unless it ran at least its floor of cases (assertProperty): a slow machine
 * must not pass a property it barely exercised. */
import fc from 'fast-check';

/** The seed every property starts from; FUZZ_SEED=<n> explores other cases. */
export const FUZZ_SEED = Number(process.env.FUZZ_SEED ?? 20261201);

/** Runs scale: FUZZ_RUNS=<factor> multiplies every property's run count (default 1). */
export const RUNS_FACTOR = Number(process.env.FUZZ_RUNS ?? 1);

/** Options for fc.assert: fixed seed, run count, time limit. */
export function options(numRuns: number, timeLimitMs: number): fc.Parameters<unknown> {
  return {
    seed: FUZZ_SEED,
    numRuns: Math.max(1, Math.round(numRuns * RUNS_FACTOR)),
    interruptAfterTimeLimit: timeLimitMs * Math.max(1, RUNS_FACTOR),
    endOnFailure: true,
  };
}

/**
 * Runs a property like fc.assert with `options(numRuns, timeLimitMs)`, and
 * fails when the time limit stopped it before `minRuns` cases ran (default a
 * quarter of the scaled run count), saying how many ran. A counterexample is
 * reported as fc.assert reports it (no shrinking: endOnFailure).
 */
export async function assertProperty<T>(
  property: fc.IAsyncProperty<T> | fc.IProperty<T>,
  numRuns: number,
  timeLimitMs: number,
  minRuns?: number,
): Promise<void> {
  const opts = options(numRuns, timeLimitMs) as fc.Parameters<T>;
  const out = await fc.check(property as fc.IAsyncProperty<T>, opts);
  if (out.failed) throw new Error(await fc.asyncDefaultReportMessage(out));
  const floor = minRuns ?? Math.max(1, Math.ceil((opts.numRuns ?? numRuns) / 4));
  if (out.numRuns < floor) {
    throw new Error(
      `The property ran only ${out.numRuns} of ${opts.numRuns} cases before its time limit of ${opts.interruptAfterTimeLimit} ms (floor ${floor}); the machine is too busy or the property too slow. Rerun, or raise the time limit.`,
    );
  }
}

/** A finite number of any size from 1e-300 to 1e300 (and 0, -0, whole numbers). */
export const anyNumber: fc.Arbitrary<number> = fc.oneof(
  { arbitrary: fc.integer({ min: -20, max: 20 }), weight: 4 },
  { arbitrary: fc.double({ min: -1000, max: 1000, noNaN: true }), weight: 3 },
  {
    arbitrary: fc
      .tuple(fc.double({ min: 1, max: 10, noNaN: true }), fc.integer({ min: -300, max: 299 }), fc.boolean())
      .map(([m, e, neg]) => (neg ? -1 : 1) * m * 10 ** e),
    weight: 3,
  },
  { arbitrary: fc.constantFrom(0, -0, 1e-300, -1e-300, 1e300, -1e300, 5e-324, Number.MAX_SAFE_INTEGER), weight: 1 },
);

/** Numbers on one scale (a column of similar magnitudes), the scale anywhere from 1e-300 to 1e300. */
export function scaledNumber(exp: number): fc.Arbitrary<number> {
  return fc.double({ min: -10, max: 10, noNaN: true }).map((m) => m * 10 ** exp);
}

/** An error value as Excel hands it over. */
export const errorCell = fc.constantFrom({ code: '#N/A' }, { code: '#DIV/0!' }, { code: '#VALUE!', message: 'x' }, { code: '#REF!' });

/** Anything a cell may hold, including what only files and scripts give (NaN, infinities). */
export const junkCell: fc.Arbitrary<unknown> = fc.oneof(
  fc.constant(null),
  fc.constant(''),
  fc.constant('  '),
  fc.constantFrom('x', 'abc', '1,5', '=A1', 'NaN', '__proto__', 'constructor', 'TRUE', '"'),
  fc.string({ maxLength: 6 }),
  fc.boolean(),
  errorCell,
  fc.constantFrom(NaN, Infinity, -Infinity),
  fc.constant(undefined),
);

/** A cell: mostly numbers, sometimes junk (share of junk set by `junk`, 0..1). */
export function cell(num: fc.Arbitrary<number>, junk: number): fc.Arbitrary<unknown> {
  const j = Math.round(junk * 100);
  return fc.oneof({ arbitrary: num, weight: 100 - j }, { arbitrary: junkCell, weight: Math.max(j, 0) });
}

/** Shape of a sample range: d columns, n rows. */
export interface RangeOptions {
  readonly maxRows?: number;
  readonly maxCols?: number;
  readonly minRows?: number;
}

/**
 * A source or target range: rows of cells, possibly with a header row, duplicated
 * rows, constant columns, one scale or wild magnitudes, junk cells, or ragged rows.
 */
export function range(d: number, opts: RangeOptions = {}): fc.Arbitrary<unknown[][]> {
  const maxRows = opts.maxRows ?? 12;
  const minRows = opts.minRows ?? 0;
  return fc
    .record({
      exp: fc.integer({ min: -300, max: 299 }),
      wild: fc.boolean(),
      junk: fc.constantFrom(0, 0, 0, 0, 0, 0.05, 0.1, 0.5),
      n: fc.integer({ min: minRows, max: maxRows }),
      header: fc.constantFrom(false, false, false, true),
      dupe: fc.constantFrom(false, false, true),
      constantCol: fc.constantFrom(-1, -1, -1, 0),
      ragged: fc.constantFrom(...new Array<boolean>(19).fill(false), true),
      seed: fc.integer(),
    })
    .chain((o) => {
      const num = o.wild ? anyNumber : fc.oneof(scaledNumber(o.exp), fc.integer({ min: -5, max: 5 }));
      const rowArb = fc.array(cell(num, o.junk), { minLength: d, maxLength: d });
      return fc.array(rowArb, { minLength: o.n, maxLength: o.n }).chain((rows) => {
        let out = rows.map((r) => [...r]);
        if (o.dupe && out.length > 1) out = [...out, ...out.slice(0, Math.ceil(out.length / 2)).map((r) => [...r])];
        if (o.constantCol === 0 && out.length > 0) for (const r of out) r[0] = out[0][0];
        if (o.header && out.length > 0) out = [Array.from({ length: d }, (_, k) => `c${k + 1}`), ...out];
        if (o.ragged && out.length > 1) {
          return fc.integer({ min: 0, max: out.length - 1 }).map((i) => {
            const copy = out.map((r) => [...r]);
            copy[i] = copy[i].length > 1 ? copy[i].slice(1) : [...copy[i], 1];
            return copy;
          });
        }
        return fc.constant(out);
      });
    });
}

/** A clean numeric range (numbers only, n rows, d columns), for properties that need fits to succeed. */
export function cleanRange(d: number, minRows: number, maxRows: number): fc.Arbitrary<number[][]> {
  return fc.integer({ min: -6, max: 6 }).chain((exp) =>
    fc.array(fc.array(fc.oneof(scaledNumber(exp), fc.integer({ min: -9, max: 9 })), { minLength: d, maxLength: d }), {
      minLength: minRows,
      maxLength: maxRows,
    }),
  );
}

/** A weights column for `rows` rows: zeros, negatives, blanks, text, huge and tiny weights, or the wrong height. */
export function weights(rows: number): fc.Arbitrary<unknown> {
  const w = fc.oneof(
    { arbitrary: fc.integer({ min: 0, max: 5 }), weight: 6 },
    { arbitrary: fc.constantFrom(0, -1, 1e300, 1e-300, 1e308, 5e-324, 0.5), weight: 2 },
    { arbitrary: junkCell, weight: 1 },
  );
  return fc.oneof(
    { arbitrary: fc.constant(undefined), weight: 3 },
    { arbitrary: fc.array(w, { minLength: rows, maxLength: rows }).map((xs) => xs.map((x) => [x])), weight: 4 },
    { arbitrary: fc.array(w, { minLength: 0, maxLength: rows + 2 }).map((xs) => xs.map((x) => [x])), weight: 1 },
    { arbitrary: fc.array(w, { minLength: rows, maxLength: rows }).map((xs) => [xs]), weight: 1 },
  );
}

/** Odd method arguments besides the registered names. */
export const oddMethod: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(
    '',
    'auto',
    'AUTO',
    ' Quantile ',
    'LINEAR',
    '__proto__',
    'constructor',
    'toString',
    'hasOwnProperty',
    'quantile;',
    'gradient net',
    'entropic\n',
  ),
  fc.string({ maxLength: 8 }),
  fc.constantFrom(5, true, null, undefined, NaN),
  errorCell,
  fc.constant([['quantile']]),
  fc.constant([['linear', 'x']]),
);

/** Odd settings: text, two-column ranges, wrong shapes. */
export const oddSettings: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(
    undefined,
    '',
    'tails=linear',
    'tails=clamp',
    'TAILS = Linear',
    'tails=sideways',
    'seed=7',
    'seed=-1',
    'seed=1e999',
    'ridge=0.1',
    'ridge=-1',
    'ridge=1e308',
    'ridge=NaN',
    'ridge=',
    '=',
    ';;;',
    'tails',
    'tails=clamp;tails=linear',
    '__proto__=1',
    'constructor=1',
    'prototype=x',
    'toString=1',
    'smoothing=0.05',
    'max_iterations=3',
    'time_budget=1',
    'a'.repeat(200) + '=1',
  ),
  fc.string({ maxLength: 12 }),
  fc.constant([['tails', 'linear']]),
  fc.constant([
    ['ridge', 0.5],
    ['', ''],
  ]),
  fc.constant([['__proto__', 1]]),
  fc.constant([[1, 2]]),
  fc.constant([['a', 'b', 'c']]),
  fc.constant(5),
  errorCell,
);

/** Deep-freezes arrays (and plain objects) so that any write to an input throws. */
export function deepFreeze<T>(v: T): T {
  if (v !== null && typeof v === 'object' && !Object.isFrozen(v)) {
    Object.freeze(v);
    for (const x of Object.values(v as object)) deepFreeze(x);
  }
  return v;
}

/** A copy for comparing after a call (arrays and plain objects; numbers compared with Object.is). */
export function snapshot(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(snapshot);
  if (v !== null && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, snapshot(x)]));
  return v;
}

export function sameDeep(a: unknown, b: unknown): boolean {
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => sameDeep(x, b[i]));
  if (a !== null && b !== null && typeof a === 'object' && typeof b === 'object') {
    const ka = Object.keys(a);
    const kb = Object.keys(b);
    return ka.length === kb.length && ka.every((k) => sameDeep((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
  }
  return Object.is(a, b);
}

/**
 * Does a rejection say what to do? The leading "where" part ("fit (quantile): ",
 * "REMAP.VALUES: ") is dropped first so that the word "fit" in it does not count.
 */
export const ACTION =
  /\b(give|select|remove|use|set|add|check|fill|replace|choose|rescale|pick|fit|clear|leave|split|apply|recalculate|load|save|close|write|sort|keep|make|try|reduce|lower|raise|increase|drop)\b/i;
/** Messages that list the allowed choices say what to do by listing them. */
export const LISTS_CHOICES =
  /known (methods|settings)|must be one of|the commands are|its options are|must be (text|true|a finite|a whole|at least|at most|greater|between)/i;

/** States what a value must be ("weights must be zero or positive"): a weaker way of saying what to do. */
export const STATES_REQUIREMENT = /\b(must|needs?|takes|only)\b/i;

/**
 * 'verb': the message tells the user what to do; 'requirement': it only states what a value
 * must be (accepted, and listed in the log for review); false: it says neither.
 */
export function saysWhatToDo(message: string): 'verb' | 'requirement' | false {
  const body = message.replace(/^(remap: )?[^:]{0,60}?:\s/, '');
  if (ACTION.test(body) || LISTS_CHOICES.test(message)) return 'verb';
  if (STATES_REQUIREMENT.test(body)) return 'requirement';
  return false;
}

/** Distinct messages (with numbers and quoted parts blanked) seen failing the strict verb check, for the report. */
export function shape(message: string): string {
  return message
    .replace(/"[^"]*"/g, '"…"')
    .replace(/-?\d[\d.e+-]*/g, 'N')
    .slice(0, 160);
}
