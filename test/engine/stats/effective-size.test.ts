import { fitMapSync, restoreMap } from '../../../src/engine/methods';
import { parseMapJSON } from '../../../src/engine/map-json';
import { sample } from '../../../src/engine/points';
import { kishEffectiveSize } from '../../../src/engine/stats/effective-size';

describe('kishEffectiveSize: (sum w)^2 / sum w^2 (Kish 1965, Survey Sampling)', () => {
  test('equal weights give the row count; null weights give n', () => {
    // Source: Kish 1965: with equal weights the design effect of weighting is 1
    expect(kishEffectiveSize(Float64Array.of(3, 3, 3, 3), 4)).toBeCloseTo(4, 12);
    expect(kishEffectiveSize(null, 17)).toBe(17);
  });

  test('uneven weights shrink it: worked by hand', () => {
    // Source: by hand, (1 + 1 + 2)^2 / (1 + 1 + 4) = 16 / 6
    expect(kishEffectiveSize(Float64Array.of(1, 1, 2), 3)).toBeCloseTo(16 / 6, 12);
    // Source: by hand, one weight of 99 among 99 weights of 1: (198)^2 / (99 + 9801) = 39204 / 9900 = 3.96
    const w = new Float64Array(100).fill(1);
    w[0] = 99;
    expect(kishEffectiveSize(w, 100)).toBeCloseTo(3.96, 12);
  });

  test('zero weights do not count, and huge or tiny weights neither overflow nor underflow', () => {
    // Source: by hand, weights (2, 0, 2): 16 / 8 = 2 rows
    expect(kishEffectiveSize(Float64Array.of(2, 0, 2), 3)).toBeCloseTo(2, 12);
    // Source: scale invariance of the ratio (multiply every weight by c: c^2 cancels)
    expect(kishEffectiveSize(Float64Array.of(1e200, 1e200, 2e200), 3)).toBeCloseTo(16 / 6, 12);
    expect(kishEffectiveSize(Float64Array.of(1e-200, 1e-200, 2e-200), 3)).toBeCloseTo(16 / 6, 12);
  });
});

describe('the small-sample warning counts effective rows, not rows', () => {
  test('100 weighted rows whose effective size is 3.96 are flagged; the same rows unweighted are not', () => {
    const x = Array.from({ length: 100 }, (_, i) => Math.sin(i) * 10);
    const y = Array.from({ length: 100 }, (_, i) => Math.cos(i) * 12 + 3);
    const w = new Array(100).fill(1);
    w[0] = 99;
    for (const method of ['quantile', 'linear']) {
      const weighted = fitMapSync(method, sample(x, w), sample(y)).diagnostics();
      // Source: by hand (see above): (198)^2 / (99 + 9801) = 3.96
      expect(weighted.effectiveSize?.source).toBeCloseTo(3.96, 10);
      expect(weighted.effectiveSize?.target).toBe(100);
      const small = weighted.warnings.find((v) => v.code === 'small-sample');
      expect(small?.message).toMatch(/The source's 100 rows carry an effective sample size of only 3\.96/);
      // Source: common practice threshold of 30 rows (base.ts)
      expect(
        fitMapSync(method, sample(x), sample(y))
          .diagnostics()
          .warnings.map((v) => v.code),
      ).not.toContain('small-sample');
    }
  });

  test('a method that does not record it gets it from fitMap, and the warning survives a JSON round trip', () => {
    const x = Array.from({ length: 60 }, (_, i) => [Math.sin(i), Math.cos(2 * i)]);
    const map = fitMapSync('pairs', sample(x), sample(x.map(([a, b]) => [a + 1, b * 2])));
    // Source: no weights: Kish's size equals the row count
    expect(map.diagnostics().effectiveSize).toEqual({ source: 60, target: 60 });
    const back = restoreMap(parseMapJSON(JSON.stringify(map.toJSON())));
    expect(back.diagnostics().effectiveSize).toEqual({ source: 60, target: 60 });
    expect(back.diagnostics().reminder).toMatch(/validate it on held-out data/);
  });
});
