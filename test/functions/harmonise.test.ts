import * as ss from 'simple-statistics';
import * as F from '../../src/functions/functions';
import { cellMap, forgetAll, recall } from '../../src/fits';
import { formulaStatus } from '../../src/taskpane/formula-status';
import { forgetAllGrouped } from '../../src/fits/grouped-store';
import { installCustomFunctionsStub, StubSheetError } from '../helpers/custom-functions-stub';

installCustomFunctionsStub();
afterEach(() => {
  forgetAll();
  forgetAllGrouped();
});

const col = (xs: (number | string)[]) => Object.freeze(xs.map((x) => Object.freeze([x]))) as unknown as any[][];

function sheetError(f: () => unknown): StubSheetError {
  try {
    f();
  } catch (e) {
    if (e instanceof StubSheetError) return e;
    throw e;
  }
  throw new Error('expected a spreadsheet error');
}

/** A seeded linear congruential generator (Numerical Recipes constants), for invented data only. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
}

describe('REMAP.BYGROUP, FITGROUPS, APPLYGROUPS, GROUPREPORT', () => {
  const srcA = [1, 2, 3, 4];
  const tgtA = [11, 12, 13, 14];
  const srcB = [1, 2, 3, 4];
  const tgtB = [101, 102, 103, 104];
  const source = col([...srcA, ...srcB]);
  const sGroups = col(['a', 'a', 'a', 'a', 'b', 'b', 'b', 'b']);
  const target = col([...tgtB, ...tgtA]);
  const tGroups = col(['b', 'b', 'b', 'b', 'a', 'a', 'a', 'a']);

  test('each value is mapped by its own group: the same 2.5 goes to 12.5 in group a and 102.5 in group b', () => {
    // Source: worked by hand: equal-size groups whose targets are the sources shifted by 10 and 100; quantile matching is then that shift
    const out = F.bygroup(col([2.5, 2.5, 4]), col(['a', 'b', 'b']), source, sGroups, target, tGroups);
    expect(out[0][0]).toBeCloseTo(12.5, 12);
    expect(out[1][0]).toBeCloseTo(102.5, 12);
    expect(out[2][0]).toBeCloseTo(104, 12);
  });

  test('by group equals fitting each group on its own with REMAP.VALUES and stacking the results, with weights, for quantile, step and ordinal', () => {
    // Source: design choice (a grouped map is each group's own map); the per-group maps come from REMAP.VALUES on the group's rows alone
    const rnd = lcg(11);
    const n = 90;
    const groupsOf = (i: number) => ['north', 'south', 'east'][i % 3];
    const s = Array.from({ length: n }, () => Math.round(rnd() * 40));
    const t = Array.from({ length: n + 12 }, () => Math.round(10 + rnd() * 60));
    const sw = Array.from({ length: n }, () => 0.5 + rnd());
    const tw = Array.from({ length: n + 12 }, () => 0.5 + rnd());
    const values = [0, 7, 13.5, 20, 33, 40];
    const vGroups = ['north', 'south', 'east', 'east', 'north', 'south'];
    for (const method of ['quantile', 'step', 'ordinal']) {
      const stacked = F.bygroup(
        col(values),
        col(vGroups),
        col(s),
        col(s.map((_, i) => groupsOf(i))),
        col(t),
        col(t.map((_, i) => groupsOf(i))),
        method,
        undefined,
        col(sw),
        col(tw),
      );
      values.forEach((v, k) => {
        const pick = (xs: number[], g: string) => xs.filter((_, i) => groupsOf(i) === g);
        const g = vGroups[k];
        const own = F.values(col([v]), col(pick(s, g)), col(pick(t, g)), method, undefined, col(pick(sw, g)), col(pick(tw, g)));
        expect(stacked[k][0]).toBe(own[0][0]);
      });
    }
  });

  test('FITGROUPS gives a handle; APPLYGROUPS applies and inverts by group; GROUPREPORT lists each group with its rows', () => {
    // Source: worked by hand, as above (shift by 10 in a, by 100 in b); row counts are the test's own data
    const handle = F.fitgroups(source, sGroups, target, tGroups) as unknown as string;
    expect(handle).toMatch(/^remap:groups-quantile:8x1:[0-9a-f]+$/);
    const applied = F.applygroups(handle, col([3, 3]), col(['a', 'b']));
    expect(applied[0][0]).toBeCloseTo(13, 12);
    expect(applied[1][0]).toBeCloseTo(103, 12);
    const back = F.applygroups(handle, col([13, 103]), col(['a', 'b']), 'invert');
    expect(back[0][0]).toBeCloseTo(3, 12);
    expect(back[1][0]).toBeCloseTo(3, 12);
    const table = F.groupreport(handle);
    expect(table[0][0]).toBe('group');
    expect(table.slice(1, 3).map((r) => [r[0], r[1], r[2]])).toEqual([
      ['a', 4, 4],
      ['b', 4, 4],
    ]);
    // Source: W2^2 between {1,2,3,4} and itself shifted by c is c^2 (fact of the trade: a shift costs its square)
    expect(table[1][5]).toBeCloseTo(100, 9);
    expect(table[2][5]).toBeCloseTo(10000, 6);
  });

  test('a group of the values with no rows is an error naming it, unless the pooled fallback stands in (as REMAP.VALUES on all rows)', () => {
    // Source: design choice for groups lacking rows; the pooled map is the map of all rows (REMAP.VALUES on the whole samples)
    const e = sheetError(() => F.bygroup(col([2]), col(['west']), source, sGroups, target, tGroups));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toContain('"west"');
    const pooled = F.bygroup(col([2]), col(['west']), source, sGroups, target, tGroups, 'quantile', undefined, undefined, undefined, 'pooled');
    expect(pooled[0][0]).toBe(F.values(col([2]), source, target)[0][0]);
  });

  test('blank values stay blank; a value with a blank group gives #VALUE! in its place; a group range of another height is refused', () => {
    // Source: design choice (README, "Input rules": blanks stay blank; a missing group is never guessed)
    const out = F.bygroup(col(['', 2]), col(['a', '']), source, sGroups, target, tGroups);
    expect(out[0][0]).toBe('');
    expect(out[1][0]).toBeInstanceOf(StubSheetError);
    const e = sheetError(() => F.bygroup(col([2]), col(['a']), source, col(['a', 'b']), target, tGroups));
    expect(e.message).toContain('source_groups has 2 rows');
  });

  test('a header row in the data and group ranges is read as a header in both', () => {
    // Source: worked by hand, as the first test
    const out = F.bygroup(col([2.5]), col(['b']), col(['x', ...srcA, ...srcB]), col(['region', 'a', 'a', 'a', 'a', 'b', 'b', 'b', 'b']), target, tGroups);
    expect(out[0][0]).toBeCloseTo(102.5, 12);
  });

  test('APPLYGROUPS on something that is not a grouped handle says what to give', () => {
    // Source: design choice (errors say what to fix)
    const e = sheetError(() => F.applygroups('remap:quantile:8x1:00ff', col([1]), col(['a'])));
    expect(e.message).toContain('REMAP.FITGROUPS');
  });
});

describe('REMAP.TOTABLE', () => {
  // Source: Abramowitz & Stegun (1964), Table 26.1: Phi(x) for x = 0, 0.5, ..., 3 (values recalled from memory to 15 digits, the table gives them)
  const PHI: [number, number][] = [
    [0, 0.5],
    [0.5, 0.691462461274013],
    [1, 0.841344746068543],
    [1.5, 0.933192798731142],
    [2, 0.977249868051821],
    [2.5, 0.993790334674224],
    [3, 0.99865010196837],
  ];
  const normalTable = [['probability', 'value'], ...[...PHI.slice(1)].reverse().map(([x, p]) => [1 - p, -x]), ...PHI.map(([x, p]) => [p, x])];
  // A uniform source on (0, 1): Hazen positions (i - 0.5) / n, so its quantile-method CDF is exactly F(u) = u between them.
  const uniform = Array.from({ length: 2000 }, (_, i) => (i + 0.5) / 2000);

  test("a uniform source onto the standard normal quantile table lands on the table's x at its probabilities", () => {
    const probs = normalTable.slice(1).map((r) => r[0] as number);
    const out = F.totable(col(probs), col(uniform), normalTable as any[][]);
    normalTable.slice(1).forEach((r, k) => expect(out[k][0]).toBeCloseTo(r[1] as number, 9));
  });

  test("between the table's points the reading is linear: Phi(0.25) maps within 0.01 of 0.25", () => {
    // Source: A&S Table 26.1, Phi(0.25) = 0.598706325683 (from memory); linear interpolation between x = 0 and 0.5 errs by at most h^2/8 max|Q''|
    const out = F.totable(col([0.598706325683]), col(uniform), normalTable as any[][]);
    expect(Math.abs((out[0][0] as number) - 0.25)).toBeLessThan(0.01);
    // Source: worked by hand: 0.5 (0.598706326 - 0.5) / (0.691462461 - 0.5) = 0.5 x 0.515539 = 0.257770
    expect(out[0][0]).toBeCloseTo(0.25777, 5);
  });

  test('a frequency table of scores gives the same result as the scores written out row by row', () => {
    // Source: design choice (a frequency table is its values written out); the written-out map is REMAP.VALUES
    const scores = [0, 1, 2, 3, 4, 5];
    const counts = [3, 5, 9, 7, 4, 2];
    const written = scores.flatMap((v, k) => new Array(counts[k]).fill(v));
    const src = [0, 1, 1, 2, 2, 2, 3, 4, 4, 5, 5, 5];
    for (const method of ['quantile', 'step', 'ordinal']) {
      const viaTable = F.totable(
        col(src),
        col(src),
        scores.map((v, k) => [v, counts[k]]),
        'frequencies',
        method,
      );
      const viaRows = F.values(col(src), col(src), col(written), method);
      viaTable.forEach((r, k) => expect(r[0]).toBeCloseTo(viaRows[k][0] as number, 12));
    }
  });

  test('a table with text in a row, or a quantile table with method step, says what to fix', () => {
    // Source: design choice (errors name the argument and the row)
    const bad = [
      ['probability', 'value'],
      [0.1, -1.28],
      ['n/a', 0],
      [0.9, 1.28],
    ];
    expect(sheetError(() => F.totable(col([0.5]), col(uniform), bad)).message).toContain('row 3 of the table');
    expect(sheetError(() => F.totable(col([0.5]), col(uniform), normalTable as any[][], 'quantiles', 'step')).code).toBe('#VALUE!');
    expect(sheetError(() => F.totable(col([0.5]), col(uniform), normalTable as any[][], 'deciles')).message).toContain('table_kind');
  });

  test('table_side "source": the normal quantile table mapped onto a uniform sample gives Phi at the table\'s points, linear in between', () => {
    const out = F.totable(col([1, 2, 0.25]), col(uniform), normalTable as any[][], undefined, undefined, undefined, undefined, undefined, 'source');
    // Source: Abramowitz & Stegun (1964), Table 26.1: Phi(1) = 0.841344746068543, Phi(2) = 0.977249868051821 (from memory, as above)
    expect(out[0][0]).toBeCloseTo(0.841344746068543, 9);
    expect(out[1][0]).toBeCloseTo(0.977249868051821, 9);
    // Source: worked by hand: the quantile curve is linear in p between (0.5, 0) and (0.691462461, 0.5),
    // so x = 0.25 sits at p = 0.5 + 0.5 x 0.191462461 = 0.595731
    expect(out[2][0]).toBeCloseTo(0.5957312306, 8);
    // Source: A&S Table 26.1, Phi(0.25) = 0.598706 (from memory): the straight-line reading errs by less than 0.005 here
    expect(Math.abs((out[2][0] as number) - 0.598706325683)).toBeLessThan(0.005);
    expect(
      sheetError(() => F.totable(col([1]), col(uniform), normalTable as any[][], undefined, undefined, undefined, undefined, undefined, 'both')).message,
    ).toContain('table_side');
  });

  test("the map's warnings (a coarse table, values in its tails) and the cell's own values outside the fitted range are recorded with the cell", () => {
    const invocation = { address: "'Wave 2'!$C$4" } as CustomFunctions.Invocation;
    F.totable(col([0.5, 1.5]), col(uniform), normalTable as any[][], undefined, undefined, undefined, undefined, undefined, undefined, invocation);
    const noted = cellMap('Wave 2!C4');
    expect(noted?.fn).toBe('REMAP.TOTABLE');
    const diag = recall(noted!.handle)!.diagnostics();
    // Source: the table above has 13 points (fewer than COARSE_POINTS = 20, a design choice) and stops at p = 0.00135 and 0.99865
    // (A&S Table 26.1), while the uniform sample's Hazen positions reach 0.00025 and 0.99975: both warnings must be there.
    expect(diag.warnings.map((w) => w.code).sort()).toEqual(['extrapolation', 'small-sample']);
    expect(diag.warnings.find((w) => w.code === 'small-sample')?.message).toContain('coarse (13 points');
    // Source: 1.5 lies beyond the sample's largest value 0.99975 (worked by hand): the cell's own call warns of one value outside
    expect(noted!.calls.map((w) => w.code)).toEqual(['extrapolation']);
    const status = formulaStatus('=REMAP.TOTABLE(C2:C3,A2:A2001,E1:F14)', diag, noted!.calls);
    // Source: design choice: the pane lists the map's two warnings and the call's own one (three lines)
    expect(status.kind).toBe('warnings');
    expect(status.lines).toHaveLength(3);
  });

  test('recalculating with unchanged inputs finds the fitted map (no fit again); a changed table fits a new one', () => {
    const cell = { address: 'Sheet1!B2' } as CustomFunctions.Invocation;
    const call = (t: unknown[][]) => F.totable(col([0.3]), col(uniform), t as any[][], undefined, undefined, undefined, undefined, undefined, undefined, cell);
    call(normalTable);
    const first = recall(cellMap('Sheet1!B2')!.handle);
    call(normalTable.map((r) => [...r]));
    // Source: design choice: the handle is made from the inputs' exact bits, so equal inputs give the very same map object
    expect(recall(cellMap('Sheet1!B2')!.handle)).toBe(first);
    call(normalTable.map((r, k) => (k === 7 ? [r[0], 0.01] : r)));
    expect(recall(cellMap('Sheet1!B2')!.handle)).not.toBe(first);
  });
});

describe('REMAP.BOUNDS', () => {
  const rnd = lcg(5);
  const src = Array.from({ length: 200 }, () => 50 + 10 * Math.sqrt(-2 * Math.log(rnd())) * Math.cos(2 * Math.PI * rnd()));
  const tgt = Array.from({ length: 150 }, () => 100 + 20 * Math.sqrt(-2 * Math.log(rnd())) * Math.cos(2 * Math.PI * rnd()));

  test('three columns per value (mapped, lower, upper); the mapped column is REMAP.VALUES; the same seed gives the same bounds', () => {
    // Source: design choice (layout); the point estimate is the map of the full samples (REMAP.VALUES)
    const a = F.bounds(col([40, 50, 60, '']), col(src), col(tgt), 'quantile', 'seed=3; replicates=199');
    const b = F.bounds(col([40, 50, 60, '']), col(src), col(tgt), 'quantile', 'seed=3; replicates=199');
    const c = F.bounds(col([40, 50, 60, '']), col(src), col(tgt), 'quantile', 'seed=4; replicates=199');
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
    expect(a[3]).toEqual(['', '', '']);
    const direct = F.values(col([40, 50, 60]), col(src), col(tgt));
    for (let k = 0; k < 3; k++) {
      expect(a[k][0]).toBe(direct[k][0]);
      expect(a[k][1]).toBeLessThan(a[k][2] as number);
    }
  });

  test('JK1 replicate weights on the target of a linear map give the textbook bounds of a mean at the source mean: m2 +- 1.96 s / sqrt(m)', () => {
    // Source: Wolter, "Introduction to Variance Estimation" (2007), ch. 4: JK1 reproduces s / sqrt(n) for a mean; z = 1.959964 (normal table);
    // the linear map sends the source mean onto the target mean; s from simple-statistics
    const m = tgt.length;
    const reps = tgt.map((_, i) => tgt.map((__, r) => (r === i ? 0 : m / (m - 1))));
    const m1 = ss.mean(src);
    const out = F.bounds(col([m1]), col(src), col(tgt), 'linear', undefined, undefined, undefined, 0.95, undefined, reps, 'jackknife');
    const half = (1.959963984540054 * ss.sampleStandardDeviation(tgt)) / Math.sqrt(m);
    expect(out[0][0]).toBeCloseTo(ss.mean(tgt), 9);
    expect(out[0][1]).toBeCloseTo(ss.mean(tgt) - half, 8);
    expect(out[0][2]).toBeCloseTo(ss.mean(tgt) + half, 8);
  });

  test('a method without bounds, a level of 95 and a bad replicate kind are errors saying what to give', () => {
    // Source: design choice (errors say what to fix)
    expect(sheetError(() => F.bounds(col([1]), col(src), col(tgt), 'entropic')).message).toContain('quantile, step, ordinal and linear');
    expect(sheetError(() => F.bounds(col([1]), col(src), col(tgt), 'quantile', undefined, undefined, undefined, 95)).message).toContain('between 0 and 1');
    const reps = tgt.map(() => [1, 1]);
    expect(
      sheetError(() => F.bounds(col([1]), col(src), col(tgt), 'quantile', undefined, undefined, undefined, 0.95, undefined, reps, 'halves')).message,
    ).toContain('replicate_kind');
  });
});
