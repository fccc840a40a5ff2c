import { cellMap, fitInThisThread, forgetAll, groupedWarnings, setFitter, type Fitter } from '../../src/fits';
import { fitGrouped, readGroupedFit } from '../../src/fits/grouped-fit';
import { forgetAllGrouped } from '../../src/fits/grouped-store';

afterEach(() => {
  setFitter(null);
  forgetAll();
  forgetAllGrouped();
  jest.restoreAllMocks();
});

const col = (xs: (number | string)[]) => xs.map((x) => [x]);
const range = <T>(n: number, f: (i: number) => T): T[] => Array.from({ length: n }, (_, i) => f(i));
// Three groups of 20 source and 25 target rows; design choice: invented values, only the group structure matters here.
const cells = (settings?: string) => ({
  source: col(range(60, (i) => i * 1.5)),
  sourceGroups: col(range(60, (i) => ['a', 'b', 'c'][i % 3])),
  target: col(range(75, (i) => 100 + i)),
  targetGroups: col(range(75, (i) => ['a', 'b', 'c'][i % 3])),
  method: 'quantile',
  ...(settings ? { settings } : {}),
});

describe('fits by group go through the fit service like REMAP.FIT', () => {
  test("each group's fit goes to the host's Fitter (a worker in the add-in), one call per group", async () => {
    const seen: number[] = [];
    const spy: Fitter = (method, source, target, settings, ctx) => {
      seen.push(source.n);
      return Promise.resolve(fitInThisThread(method, source, target, settings, ctx));
    };
    setFitter(spy);
    const map = await fitGrouped(readGroupedFit('REMAP.FITGROUPS', cells()));
    // Source: the data above: groups a, b, c with 20 source rows each (design choice: the groups' order is first seen)
    expect(seen).toEqual([20, 20, 20]);
    expect(map.groups()).toEqual(['a', 'b', 'c']);
  });

  test('the time_budget setting covers the whole fit by group: past it, an error says the budget ran out and what to do', () => {
    let now = 1_000_000;
    jest.spyOn(Date, 'now').mockImplementation(() => (now += 1000)); // every reading of the clock moves one second on
    const run = () => fitGrouped(readGroupedFit('REMAP.FITGROUPS', cells('time_budget=2.5')));
    // Design choice: the budget is checked between groups, so 2.5 s (of the fake clock) stops the fit before its third group.
    expect(run).toThrow(/REMAP\.FITGROUPS: the quantile fit of 60 x 75 rows was stopped when its time budget of 2\.5 s ran out\. Give it more time/);
  });

  test('a caller that cancels stops the fit by group with a cancelled error, not a budget error', () => {
    expect(() => fitGrouped(readGroupedFit('REMAP.FITGROUPS', cells()), undefined, { signal: { aborted: true } })).toThrow(/cancelled before every group/);
  });
});

describe("a fit by group in a formula cell, for the pane's list of formulas", () => {
  test('the cell is recorded with the handle of its map by group', () => {
    fitGrouped(readGroupedFit('REMAP.BYGROUP', cells()), undefined, { cell: "'Wave 2'!$D$2" });
    // Source: design choice: the pane finds a BYGROUP cell's map through the cell's record.
    expect(cellMap('wave 2!d2')).toMatchObject({ fn: 'REMAP.BYGROUP' });
    expect(cellMap('wave 2!d2')!.handle).toMatch(/^remap:groups-quantile:/);
  });

  test("every group's warnings, named by group, after the warnings about the grouping", () => {
    // Group c has one source row: the pooled map stands in for it (fallback pooled); a and b have 8 rows each.
    const few = {
      ...cells(),
      source: col(range(17, (i) => i * 1.5)),
      sourceGroups: col(range(17, (i) => (i === 16 ? 'c' : ['a', 'b'][i % 2]))),
      fallback: 'pooled',
    };
    const map = fitGrouped(readGroupedFit('REMAP.FITGROUPS', few));
    const ws = groupedWarnings((map as Exclude<typeof map, Promise<unknown>>).report());
    // Source: design choice: the grouping's own warning (the pooled map standing in for c) comes first.
    expect(ws[0].message).toMatch(/stands in for 1 group: "c"/);
    // Source: design choice: a group's own warnings are led by its name (groups of 8 rows get the small-sample warning).
    expect(ws.some((w) => /^Group "a": /.test(w.message))).toBe(true);
    expect(ws.every((w, i) => i === 0 || /^Group "(a|b|c)": /.test(w.message))).toBe(true);
  });
});
