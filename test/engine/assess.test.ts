import { compareOn } from '../../src/engine/assess';
import { fitMapSync } from '../../src/engine/methods';
import { sample } from '../../src/engine/points';
import { compareFit, COMPARISON_MAX_ROWS, COMPARISON_SEED } from '../../src/engine/assess';
import { energyDistance } from '../../src/engine/stats/energy-distance';
import { ksStatistic } from '../../src/engine/stats/ks';
import { columnOf, points } from '../../src/engine/points';

describe('compareFit(source, ws, mapped, target, wt) records energy before/after and the largest KS after', () => {
  const source = points([
    [0, 0],
    [1, 0],
    [0, 1],
    [1, 1],
  ]);
  const target = points([
    [3, 3],
    [5, 3],
    [3, 6],
    [5, 6],
  ]);

  test('a mapped sample equal to the target has energyAfter 0 and ksMaxAfter 0', () => {
    const c = compareFit(source, null, target, target, null);
    expect(c.energyAfter).toBe(0);
    expect(c.ksMaxAfter).toBe(0);
    // Source: energyDistance and ksStatistic with the documented options
    expect(c.energyBefore).toBe(energyDistance(source, target, null, null, { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED }).value);
  });

  test('ksMaxAfter is the largest per-column KS statistic, with weights', () => {
    const mapped = points([
      [3, 3],
      [5, 3],
      [3, 6],
      [6, 6],
    ]);
    const w = Float64Array.from([1, 2, 1, 1]);
    const c = compareFit(source, w, mapped, target, null);
    const ks = Math.max(ksStatistic(columnOf(mapped, 0), columnOf(target, 0), w), ksStatistic(columnOf(mapped, 1), columnOf(target, 1), w));
    expect(c.ksMaxAfter).toBe(ks);
    expect(c.ksMaxAfter).toBeGreaterThan(0);
  });
});

describe('compareOn(map, source, target): several maps measured on the same rows', () => {
  const rows = (n: number, shift: number) => Array.from({ length: n }, (_, i) => [Math.sin(i * 1.3) + shift, Math.cos(i * 0.7) * 2 + shift]);

  test('the figures are those of energyDistance and ksStatistic on the rows given, and the record says so', () => {
    const src = sample(rows(60, 0));
    const tgt = sample(rows(80, 3));
    const lin = fitMapSync('linear', src, tgt);
    const q = fitMapSync('quantile', src, tgt);
    const held = sample(rows(50, 0.1));
    const heldT = sample(rows(70, 3.1));
    for (const map of [lin, q]) {
      const c = compareOn(map, held, heldT);
      const mapped = map.apply(held);
      // Source: energyDistance (Szekely & Rizzo 2013) on the same rows, computed here separately
      expect(c.energyBefore).toBe(energyDistance(held, heldT, null, null, { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED }).value);
      expect(c.energyAfter).toBe(energyDistance(mapped, heldT, null, null, { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED }).value);
      expect(c.comparison).toMatchObject({ basis: 'rows given', ks: { source: 50, target: 70 }, energy: { source: 50, target: 70 }, seed: null });
      expect(c.comparison.note).toMatch(/the same rows for every map/);
    }
    // Source: design choice (a map's own figures say they were measured on its fitting rows)
    expect(lin.diagnostics().comparison).toMatchObject({ basis: 'fitting rows', ks: { source: 60, target: 80 } });
    expect(lin.diagnostics().comparison?.note).toMatch(/not comparable/);
  });

  test('a subsample is named with its seed and row counts', () => {
    const src = sample(rows(1500, 0));
    const tgt = sample(rows(1200, 3));
    const map = fitMapSync('linear', src, tgt);
    const c = map.diagnostics().comparison;
    // Source: design choice (COMPARISON_MAX_ROWS rows per side above it, seed COMPARISON_SEED)
    expect(c).toMatchObject({ energy: { source: COMPARISON_MAX_ROWS, target: COMPARISON_MAX_ROWS }, seed: COMPARISON_SEED });
    expect(c?.note).toMatch(/seeded random subsample of 1000 source and 1000 target rows \(seed 0\)/);
  });

  test('refuses rows of another width, and a pairs map on rows it was not fitted on', () => {
    const src = sample(rows(10, 0));
    const tgt = sample(rows(10, 3));
    const lin = fitMapSync('linear', src, tgt);
    expect(() => compareOn(lin, sample([[1, 2, 3]]), sample([[1, 2, 3]]))).toThrow(/compareOn: the rows have 3 columns but the linear map takes 2/);
    const pairs = fitMapSync('pairs', src, tgt);
    expect(() => compareOn(pairs, sample(rows(10, 0.5)), tgt)).toThrow(/compareOn: the pairs map cannot map these rows/);
  });
});
