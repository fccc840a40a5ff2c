import { fitGroupedMapSync } from '../../src/engine/groups/fit-grouped';
import { GROUP_LIST_HEADER, groupList } from '../../src/taskpane/group-list';

const sample = (xs: number[], w?: number[]) => ({ n: xs.length, d: 1, data: Float64Array.from(xs), weights: w ? Float64Array.from(w) : null });

describe("the pane's list of groups of a map by group", () => {
  // Group a: target = source + 10, group b: target = source + 20, with the same weights on both sides.
  const xs = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9];
  const w = [1, 1, 1, 1, 4, 1, 1, 1, 1, 1];
  const groups = ['a', 'a', 'a', 'a', 'a', 'b', 'b', 'b', 'b', 'b'];
  const shift = xs.map((x, i) => x + (i < 5 ? 10 : 20));
  const map = fitGroupedMapSync('quantile', sample(xs, w), groups, sample(shift, w), groups);
  const list = groupList(map.report());

  test('one row per group with sizes, Kish effective sizes, the cost with its label, and the map used', () => {
    expect(list.header).toEqual([...GROUP_LIST_HEADER]);
    expect(list.rows.map((r) => r[0])).toEqual(['a', 'b']);
    // Source: worked by hand: Kish effective rows (sum w)^2 / sum w^2 = 8^2 / 20 = 3.2 for group a, 5^2 / 5 = 5 for group b
    expect(list.rows[0].slice(1, 5)).toEqual(['5', '5', '3.2', '3.2']);
    expect(list.rows[1].slice(1, 5)).toEqual(['5', '5', '5', '5']);
    // Source: a translation by c moves every quantile by c, so squared W2 = c^2: 100 and 400 (fact of the trade);
    // the label is the 1-D exact cost's (the quantile coupling is optimal in 1-D)
    expect(list.rows[0][5]).toBe('100 (squared W2, exact)');
    expect(list.rows[1][5]).toBe('400 (squared W2, exact)');
    expect(list.rows[0][6]).toBe('own');
  });

  test("each group's warnings are in words with what to do; the caption and the all-groups line say what the table is", () => {
    // Source: design choice: fewer than 30 rows is a small sample, and the pane words it "Small sample"
    expect(list.rows[0][7]).toMatch(/^Small sample: .* What to do: /);
    expect(list.caption).toBe('2 groups of this quantile map by group: rows, effective rows (Kish), cost and warnings per group');
    // Source: worked by hand: source weights 8 and 5, so the weighted mean cost is (8 x 100 + 5 x 400) / 13 = 215.4
    expect(list.notes[0]).toMatch(/^All groups: 215\.4\. /);
  });

  test('groups mapped by the pooled map say so, and the grouping warning follows the table', () => {
    const pooled = fitGroupedMapSync('quantile', sample(xs), groups, sample(shift), groups, {}, { fallback: 'pooled', valueGroups: ['c'] });
    const l = groupList(pooled.report());
    // Source: design choice: group c has no rows, so the map fitted on all rows stands in and the list says so
    expect(l.rows.find((r) => r[0] === 'c')?.[6]).toBe('pooled (all rows)');
    expect(l.notes.some((n) => n.includes('"c" (no source and no target rows)'))).toBe(true);
  });
});
