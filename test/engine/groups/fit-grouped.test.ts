import { fitGroupedMap, fitGroupedMapSync } from '../../../src/engine/groups/fit-grouped';
import { parseGroupedMapJSON, restoreGroupedMap } from '../../../src/engine/groups/grouped-json';
import { kishRows } from '../../../src/engine/groups/effective-rows';
import { fitMap } from '../../../src/engine/methods';
import type { Points, Sample } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';

/** Rows of one group, built here from the test's own lists (not through the grouping code). */
interface Side {
  data: number[][];
  weights: number[] | null;
  groups: string[];
}

function makeSide(seed: number, sizes: Record<string, number>, d: number, whole: boolean, weighted: boolean, shift: number): Side {
  const r = new Random(seed);
  const side: Side = { data: [], weights: weighted ? [] : null, groups: [] };
  // Interleave the groups row by row so the split has work to do.
  const left = { ...sizes };
  let g = 0;
  const names = Object.keys(sizes);
  while (names.some((k) => left[k] > 0)) {
    const k = names[g++ % names.length];
    if (left[k] === 0) continue;
    left[k]--;
    const offset = names.indexOf(k) * 3 + shift;
    side.data.push(Array.from({ length: d }, () => (whole ? Math.floor(r.uniform() * 8) + offset : r.normal() * (1 + names.indexOf(k)) + offset)));
    side.weights?.push(0.5 + r.uniform());
    side.groups.push(k);
  }
  return side;
}

function toSample(s: Side, keep: (i: number) => boolean = () => true): Sample {
  const rows = s.data.filter((_, i) => keep(i));
  const d = s.data[0].length;
  return { n: rows.length, d, data: Float64Array.from(rows.flat()), weights: s.weights ? Float64Array.from(s.weights.filter((_, i) => keep(i))) : null };
}

function toPoints(rows: number[][]): Points {
  return { n: rows.length, d: rows[0].length, data: Float64Array.from(rows.flat()) };
}

const CASES: { method: string; d: number; whole?: boolean; weighted: boolean; equal?: boolean; settings?: Record<string, unknown> }[] = [
  { method: 'quantile', d: 1, weighted: true },
  { method: 'step', d: 1, weighted: true },
  { method: 'ordinal', d: 1, whole: true, weighted: true },
  { method: 'linear', d: 2, weighted: true },
  { method: 'pairs', d: 2, weighted: false, equal: true },
  { method: 'entropic', d: 2, weighted: true },
  { method: 'gradient-net', d: 2, weighted: true, settings: { steps: 2, hidden: 4, batch: 16 } },
];

describe('fitGroupedMap: one map per group', () => {
  test.each(CASES)('$method: equals fitting each group on its own and stacking the results, apply and invert', async (c) => {
    const sizes = c.equal ? { north: 24, south: 30, east: 20 } : { north: 24, south: 30, east: 20 };
    const tSizes = c.equal ? sizes : { north: 28, south: 22, east: 26 };
    const src = makeSide(11, sizes, c.d, !!c.whole, c.weighted, 0);
    const tgt = makeSide(12, tSizes, c.d, !!c.whole, c.weighted, 5);
    const grouped = await fitGroupedMap(c.method, toSample(src), src.groups, toSample(tgt), tgt.groups, c.settings ?? {});
    expect(grouped.groups()).toEqual(['north', 'south', 'east']);
    // Values: the source rows themselves, and each group mapped by its own separately fitted map.
    const values = toPoints(src.data);
    const got = grouped.apply(values, src.groups);
    const expected = new Float64Array(values.n * c.d);
    const canInvert = c.method !== 'pairs' && c.method !== 'entropic';
    const back = canInvert ? grouped.invert(got, src.groups) : null;
    const expectedBack = new Float64Array(values.n * c.d);
    for (const g of ['north', 'south', 'east']) {
      const own = await fitMap(
        c.method,
        toSample(src, (i) => src.groups[i] === g),
        toSample(tgt, (i) => tgt.groups[i] === g),
        c.settings ?? {},
      );
      const idx = src.groups.map((x, i) => (x === g ? i : -1)).filter((i) => i >= 0);
      const mapped = own.apply(toPoints(idx.map((i) => src.data[i])));
      idx.forEach((row, j) => {
        for (let k = 0; k < c.d; k++) expected[row * c.d + k] = mapped.data[j * c.d + k];
      });
      if (back) {
        const inv = own.invert(mapped);
        idx.forEach((row, j) => {
          for (let k = 0; k < c.d; k++) expectedBack[row * c.d + k] = inv.data[j * c.d + k];
        });
      }
      own.dispose();
    }
    // Source: the definition of a map by group (each group fitted on its own); bit-identical is a design choice.
    expect(Array.from(got.data)).toEqual(Array.from(expected));
    if (back) expect(Array.from(back.data)).toEqual(Array.from(expectedBack));
    const report = grouped.report();
    expect(report.groups.map((g) => [g.group, g.rows.source, g.rows.target])).toEqual([
      ['north', sizes.north, tSizes.north],
      ['south', sizes.south, tSizes.south],
      ['east', sizes.east, tSizes.east],
    ]);
    // JSON round trip: the same text again, and the same numbers.
    const text = JSON.stringify(grouped.toJSON());
    const restored = restoreGroupedMap(parseGroupedMapJSON(text));
    expect(JSON.stringify(restored.toJSON())).toBe(text);
    expect(Array.from(restored.apply(values, src.groups).data)).toEqual(Array.from(got.data));
    grouped.dispose();
    restored.dispose();
  });

  test('a group present in the values but missing from the target is an error naming it', () => {
    const s = { n: 6, d: 1, data: Float64Array.of(1, 2, 3, 4, 5, 6), weights: null };
    const t = { n: 4, d: 1, data: Float64Array.of(10, 20, 30, 40), weights: null };
    expect(() => fitGroupedMapSync('quantile', s, ['a', 'a', 'a', 'b', 'b', 'b'], t, ['a', 'a', 'a', 'a'])).toThrow(/group "b" has no target rows/);
    expect(() => fitGroupedMapSync('quantile', s, ['a', 'a', 'a', 'a', 'a', 'a'], t, ['a', 'a', 'a', 'a'], {}, { valueGroups: ['a', 'zz'] })).toThrow(
      /group "zz" has no source and no target rows/,
    );
  });

  test('fewer Kish effective rows than the method needs is an error naming the group, unless pooled, which warns naming it', () => {
    // Group b's source weights 1 and 9: Kish (1 + 9)^2 / (1 + 81) = 1.22 effective rows, fewer than the 2 quantile needs.
    // Source: Kish, "Survey Sampling" (1965), effective sample size (sum w)^2 / sum w^2.
    expect(kishRows(2, Float64Array.of(1, 9))).toBeCloseTo(100 / 82, 12);
    const s = { n: 8, d: 1, data: Float64Array.of(1, 2, 3, 3.5, 3.7, 3.9, 4, 5), weights: Float64Array.of(1, 1, 1, 1, 1, 1, 1, 9) };
    const t = { n: 6, d: 1, data: Float64Array.of(10, 20, 30, 40, 50, 60), weights: null };
    const sg = ['a', 'a', 'a', 'a', 'a', 'a', 'b', 'b'];
    const tg = ['a', 'a', 'a', 'b', 'b', 'b'];
    expect(() => fitGroupedMapSync('quantile', s, sg, t, tg)).toThrow(/group "b" has 1\.22 effective source rows, fewer than the 2 the quantile method needs/);
    const m = fitGroupedMapSync('quantile', s, sg, t, tg, {}, { fallback: 'pooled' });
    const rep = m.report();
    expect(rep.groups.find((g) => g.group === 'b')!.pooled).toBe(true);
    expect(rep.warnings.map((w) => w.message).join(' ')).toMatch(/"b" \(1\.22 effective source rows/);
    // Group b is mapped by the pooled map: the same numbers as a map on all rows.
    const all = fitGroupedMapSync('quantile', s, ['p', 'p', 'p', 'p', 'p', 'p', 'p', 'p'], t, ['p', 'p', 'p', 'p', 'p', 'p']);
    const x = { n: 1, d: 1, data: Float64Array.of(4.5) };
    expect(m.apply(x, ['b']).data[0]).toBe(all.apply(x, ['p']).data[0]);
    // An unseen group at apply time goes to the pooled map and is named in the report.
    m.apply(x, ['new']);
    expect(
      m
        .report()
        .warnings.map((w) => w.message)
        .join(' '),
    ).toMatch(/"new" \(1 row\)/);
  });

  test('an unknown group when applying, without a pooled map, is an error listing the known groups', () => {
    const s = { n: 4, d: 1, data: Float64Array.of(1, 2, 3, 4), weights: null };
    const m = fitGroupedMapSync('quantile', s, [1, 1, 2, 2], s, ['1', '1', '2', '2']);
    expect(m.groups()).toEqual(['1', '2']);
    expect(() => m.apply({ n: 1, d: 1, data: Float64Array.of(1) }, ['3'])).toThrow(/group "3" is not one the map was fitted on \(its groups: "1", "2"\)/);
  });

  test('a group whose own fit fails names the group', () => {
    const s = { n: 4, d: 1, data: Float64Array.of(1, 1, 3, 4), weights: null };
    const t = { n: 4, d: 1, data: Float64Array.of(1, 2, 3, 4), weights: null };
    expect(() => fitGroupedMapSync('quantile', s, ['a', 'a', 'b', 'b'], t, ['a', 'a', 'b', 'b'])).toThrow(/group "a": .*same value/);
  });

  test('damaged grouped JSON is refused with a message', () => {
    const s = { n: 4, d: 1, data: Float64Array.of(1, 2, 3, 4), weights: null };
    const m = fitGroupedMapSync('quantile', s, ['a', 'a', 'b', 'b'], s, ['a', 'a', 'b', 'b']);
    const j = JSON.parse(JSON.stringify(m.toJSON()));
    j.groups[1].map = null;
    expect(() => parseGroupedMapJSON(JSON.stringify(j))).toThrow(/neither a map nor a reason/);
    expect(() => parseGroupedMapJSON('{"__proto__": 1}')).toThrow(/forbidden key/);
  });
});
