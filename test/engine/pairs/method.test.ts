import { RemapError } from '../../../src/engine/errors';
import type { Progress } from '../../../src/engine/map';
import { fitMap, fitMapSync, prepareFit, restoreMap } from '../../../src/engine/methods';
import { fitPairs, pairsMethod } from '../../../src/engine/pairs/method';
import { column, sample, toRows } from '../../../src/engine/points';
import { divideColumns, pooledColumnScales } from '../../../src/engine/stats/column-scales';

function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

describe('pairsMethod', () => {
  test('pairsMethod is a joint method named pairs, without weights, whose one setting is units, needing 1 row', () => {
    expect(pairsMethod.name).toBe('pairs');
    expect(pairsMethod.shape).toBe('joint');
    expect(pairsMethod.weights).toBe(false);
    expect(pairsMethod.settings.map((s) => s.name)).toEqual(['units']);
    expect(pairsMethod.minRows(1)).toBe(1);
    expect(pairsMethod.minRows(7)).toBe(1);
    expect(pairsMethod.summary.length).toBeGreaterThan(10);
  });

  test('fitMapSync("pairs") fits synchronously and restoreMap brings the map back from JSON', () => {
    const rows = Object.freeze([Object.freeze([1, 2]), Object.freeze([3, 1]), Object.freeze([0, 0])]);
    const m = fitMapSync(
      'pairs',
      sample(rows),
      sample([
        [10, 10],
        [0, 1],
        [12, 11],
      ]),
    );
    expect(m.method).toBe('pairs');
    const back = restoreMap(JSON.parse(JSON.stringify(m.toJSON())));
    expect(toRows(back.apply(sample(rows)))).toEqual(toRows(m.apply(sample(rows))));
    expect(back.cost()).toEqual(m.cost());
  });

  test('fitMap("pairs") with unequal sizes throws a RemapError that suggests the entropic method', async () => {
    await expect(fitMap('pairs', sample([1, 2, 3]), sample([1, 2]))).rejects.toThrow(/source has 3 rows and the target 2.*entropic method/);
  });

  test('prepareFit rejects row weights for pairs, and fitPairs does too when called directly', () => {
    expect(() => prepareFit(pairsMethod, sample([1, 2], [1, 1]), sample([1, 2]), {})).toThrow(/does not take row weights/);
    expect(() => fitPairs(sample([1, 2]), sample([1, 2], [1, 2]), { units: 'raw' })).toThrow(/does not take row weights/);
  });

  test('fitMap("pairs") reports progress and stops with kind cancelled when the signal turns true', async () => {
    const r = rng(9);
    const n = 300;
    const src = sample(Array.from({ length: n }, () => [r(), r()]));
    const tgt = sample(Array.from({ length: n }, () => [r() * 2, r() + 3]));
    const seen: Progress[] = [];
    const m = await fitMap('pairs', src, tgt, {}, { onProgress: (p) => seen.push(p) });
    expect(seen.length).toBeGreaterThan(0);
    expect(seen[seen.length - 1].loss).toBe(0);
    expect(m.diagnostics().convergence?.iterations).toBe(seen[seen.length - 1].of);
    const signal = { aborted: false };
    await expect(
      fitMap(
        'pairs',
        src,
        tgt,
        {},
        {
          signal,
          onProgress: (p) => {
            if (p.step > 0) signal.aborted = true;
          },
        },
      ),
    ).rejects.toMatchObject({ kind: 'cancelled' });
  });

  test('fitPairs records columns and dropped rows from the context, and its cost is the 1-D sorted W2^2 in one column', () => {
    const m = fitPairs(sample([3, 1, 2]), sample([20, 40, 30]), { units: 'raw' }, { columns: ['v'], dropped: { source: 2, target: 0 } });
    const dg = m.diagnostics();
    expect(dg.columns).toEqual(['v']);
    expect(dg.dropped).toEqual({ source: 2, target: 0 });
    expect(dg.warnings.map((w) => w.code)).toContain('rows-dropped');
    // Source: common practice (1-D monotone rearrangement): ((1-20)^2 + (2-30)^2 + (3-40)^2) / 3 = (361 + 784 + 1369) / 3 = 838.
    expect(dg.cost.w2Squared).toBe(838);
    expect(Array.from(m.apply(column([1, 2, 3])).data)).toEqual([20, 30, 40]);
  });

  test('apply on a new point is an error, never an interpolated value', () => {
    const m = fitPairs(sample([0, 1]), sample([0, 1]), { units: 'raw' });
    expect(() => m.apply(column([0.5]))).toThrow(RemapError);
  });

  test('units = standardised (the default) pairs the rows as the raw pairing of both samples divided by the pooled column spreads', () => {
    // Source: the definition of fitting in standardised units (src/engine/stats/column-scales.ts). Two columns on scales
    // 1 and 1000: in raw units the second column decides the pairing; standardised, both count.
    const src = sample([
      [0, 0],
      [1, 1000],
      [2, 3000],
      [3, 500],
    ]);
    const tgt = sample([
      [3, 0],
      [2, 2000],
      [1, 2500],
      [0, 1000],
    ]);
    const scales = pooledColumnScales(src, tgt);
    const divided = fitPairs(divideColumns(src, scales), divideColumns(tgt, scales), { units: 'raw' }).pairs();
    expect(Array.from(fitPairs(src, tgt, {}).pairs())).toEqual(Array.from(divided));
    const raw = fitPairs(src, tgt, { units: 'raw' });
    expect(raw.diagnostics().settings.units).toBe('raw');
    expect(Array.from(raw.pairs())).not.toEqual(Array.from(divided));
    expect(fitPairs(src, tgt, {}).cost().note).toMatch(/standardised units/);
  });
});
