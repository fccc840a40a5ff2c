import { checkSameColumns, checkSample, checkScale, MAX_ABS_VALUE, MIN_SPREAD } from '../../src/engine/validate';
import { sample, type Sample } from '../../src/engine/points';
import { fitMap } from '../../src/engine/methods';

describe('validate', () => {
  test('checkSample: too few rows, negative and all-zero weights are errors that say what to do', () => {
    expect(() => checkSample(sample([1]), 'source', 2, 'fit')).toThrow('fit: the source has 1 usable row but at least 2 are needed; give more rows.');
    expect(() => checkSample(sample([1, 2], [1, -1]), 'source', 2, 'fit')).toThrow(/negative \(-1\); weights must be zero or positive/);
    expect(() => checkSample(sample([1, 2], [0, 0]), 'target', 2, 'fit')).toThrow(/all target weights are zero; give at least one positive weight/);
    expect(() => checkSample(sample([1, 2, 3], [0, 0, 1]), 'target', 2, 'fit')).toThrow(/only 1 target row has positive weight/);
  });

  test('checkSameColumns names both column counts', () => {
    expect(() => checkSameColumns(sample([[1, 2]]), sample([[1]]), 'fit')).toThrow(/source has 2 columns and the target 1/);
  });

  test('checkScale refuses values whose squares overflow or whose spread underflows, and says to rescale', () => {
    // Source: IEEE 754 doubles: the largest is about 1.8e308, the smallest normal about 2.2e-308
    expect(MAX_ABS_VALUE ** 2).toBeLessThan(Number.MAX_VALUE);
    expect(MIN_SPREAD ** 2).toBeGreaterThan(2.2250738585072014e-308);
    expect(() =>
      checkScale(
        sample([
          [1e151, 0],
          [0, 1],
        ]),
        'source',
        'fit',
      ),
    ).toThrow(/column 1 of the source holds values as large as 1\.00e\+151.*rescale/);
    expect(() =>
      checkScale(
        sample([
          [1, 1e-300],
          [1, 2e-300],
        ]),
        'target',
        'fit',
      ),
    ).toThrow(/column 2 of the target varies by only 1\.00e-300.*rescale/);
    expect(() =>
      checkScale(
        sample([
          [5, 1],
          [5, 2],
        ]),
        'source',
        'fit',
      ),
    ).not.toThrow(); // a constant column is not a scale problem
  });

  test('joint methods refuse data at 1e-300 scale with #NUM! instead of mapping everything to the mean', async () => {
    const xs = [-5, 2, -3, 4, -1, 6, 1, -4, 3, -2, 5, 0].map((v) => [v * 1e-300, v * 1e-300]);
    const ys = [1, 6, 11, 4, 9, 2, 7, 12, 5, 10, 3, 8].map((v) => [v * 1e-300, -v * 1e-300]);
    for (const m of ['entropic', 'gradient-net', 'pairs']) {
      await expect(fitMap(m, sample(xs), sample(ys))).rejects.toMatchObject({ kind: 'num', message: expect.stringMatching(/rescale/) });
    }
  });
});

describe('samples built by hand', () => {
  test('a sample without a weights field fits as one with weights: null, for every kind of method', async () => {
    // Design choice: rows from a fixed formula.
    const src = { n: 30, d: 2, data: Float64Array.from({ length: 60 }, (_, i) => Math.sin(i)) };
    const tgt = { n: 30, d: 2, data: Float64Array.from({ length: 60 }, (_, i) => Math.cos(i) * 2) };
    for (const method of ['quantile', 'linear', 'pairs']) {
      const bare = await fitMap(method, src as unknown as Sample, tgt as unknown as Sample);
      const built = await fitMap(method, { ...src, weights: null }, { ...tgt, weights: null });
      // Source: design choice: a missing weights field means unweighted rows, the same map as weights: null.
      expect(bare.cost().w2Squared).toBe(built.cost().w2Squared);
    }
  });

  test('a sample of the wrong shape is refused with how to build one', async () => {
    const bad = { n: 3, d: 2, data: Float64Array.of(1, 2, 3) } as unknown as Sample;
    const ok = { n: 3, d: 2, data: Float64Array.of(1, 2, 3, 4, 5, 6), weights: null };
    await expect(fitMap('linear', bad, ok)).rejects.toThrow(/the source data do not hold n x d = 6 numbers; build samples with sample\(rows\)/);
    await expect(fitMap('quantile', ok, { n: 3, d: 2 } as unknown as Sample)).rejects.toThrow(/the target data do not hold/);
  });
});
