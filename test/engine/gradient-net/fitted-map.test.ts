import { extrapolationWarning } from '../../../src/engine/outside';
import { GradientNetMap } from '../../../src/engine/gradient-net/fitted-map';
import type { MapJSON } from '../../../src/engine/map';
import { Random } from '../../../src/engine/stats/random';
import { closedForm, randomParams } from './helpers';

function makeMap(tails: 'clamp' | 'linear'): GradientNetMap {
  const p = randomParams(2, 6, 1, 3);
  const frame = { mean: Float64Array.of(1, 2), scale: Float64Array.of(2, 2), lo: Float64Array.of(-3, -2), hi: Float64Array.of(5, 6) };
  const header = {
    method: 'gradient-net' as const,
    d: 2,
    settings: { tails },
    columns: null,
    n: { source: 50, target: 50 },
    dropped: { source: 0, target: 0 },
  };
  const cost = { kind: 'mapped' as const, w2Squared: 1, w2: 1, note: '' };
  return new GradientNetMap(header, { cost, warnings: [] }, p, frame, frame);
}

describe('GradientNetMap', () => {
  test('counts rows outside the fitted range; clamp maps them like the nearest in-range point', () => {
    const map = makeMap('clamp');
    const r = map.apply({ n: 2, d: 2, data: Float64Array.of(10, 0, 5, 0) });
    expect(r.outside).toBe(1);
    expect(r.data[0]).toBe(r.data[2]); // Source: tails=clamp, x = 10 clamps to 5
    expect(extrapolationWarning(map, r)?.code).toBe('extrapolation');
    const lin = makeMap('linear').apply({ n: 2, d: 2, data: Float64Array.of(10, 0, 5, 0) });
    expect(lin.data[0]).not.toBe(lin.data[2]);
  });

  test('jacobianAt is symmetric positive definite in original units when the columns share one scale', () => {
    const j = makeMap('linear').jacobianAt([0.5, 1]);
    expect(j[1]).toBe(j[2]);
    expect(j[0]).toBeGreaterThan(0);
    expect(j[0] * j[3] - j[1] * j[2]).toBeGreaterThan(0);
    expect(() => makeMap('linear').jacobianAt([1])).toThrow(/give 2/);
  });

  test('fromJSON rejects damaged parameters with a message saying what to do', () => {
    const json = makeMap('linear').toJSON();
    const bad = (params: unknown) => ({ ...json, params }) as MapJSON;
    const p = json.params as { network: Record<string, unknown>; source: unknown; target: unknown };
    expect(() => GradientNetMap.fromJSON(bad(null))).toThrow(/no network parameters/);
    expect(() => GradientNetMap.fromJSON(bad({ ...p, network: { ...p.network, w: [1, 'x'] } }))).toThrow(/w\[1\] is x/);
    expect(() => GradientNetMap.fromJSON(bad({ ...p, source: { mean: [0, 0], scale: [1, -1], lo: [0, 0], hi: [1, 1] } }))).toThrow(
      /column 2 is -1; it must be a positive/,
    );
    // A map saved with one scale number for all columns (earlier format) still loads and maps the same.
    const old = bad({ ...p, source: { ...(p.source as object), scale: 2 }, target: { ...(p.target as object), scale: 2 } });
    expect(GradientNetMap.fromJSON(old).apply({ n: 1, d: 2, data: Float64Array.of(1, 1) }).data).toEqual(
      makeMap('linear').apply({ n: 1, d: 2, data: Float64Array.of(1, 1) }).data,
    );
    expect(GradientNetMap.fromJSON(JSON.parse(JSON.stringify(json))).apply({ n: 1, d: 2, data: Float64Array.of(1, 1) }).data).toEqual(
      makeMap('linear').apply({ n: 1, d: 2, data: Float64Array.of(1, 1) }).data,
    );
  });
  test.each(['linear', 'clamp'] as const)(
    'tails = %s: apply equals m_t + D_t F(D_s^-1 (x - m_s)) with F written out directly, over several blocks of rows',
    (tails) => {
      const d = 5;
      const p = randomParams(d, 24, 1, 8);
      const source = {
        mean: Float64Array.of(1, -2, 0.5, 3, 0),
        scale: Float64Array.of(2, 0.5, 1, 4, 1.5),
        lo: Float64Array.of(-4, -3, -2, -5, -3),
        hi: Float64Array.of(6, -1, 3, 11, 3),
      };
      const target = { mean: Float64Array.of(0, 1, 2, 3, 4), scale: Float64Array.of(3, 0.75, 1.5, 6, 2.25), lo: source.lo, hi: source.hi };
      const header = { method: 'gradient-net' as const, d, settings: { tails }, columns: null, n: { source: 9, target: 9 }, dropped: { source: 0, target: 0 } };
      const cost = { kind: 'mapped' as const, w2Squared: 1, w2: 1, note: '' };
      const map = new GradientNetMap(header, { cost, warnings: [] }, p, source, target);
      const r = new Random(5);
      // 2500 rows: two full blocks of 1024 rows and a partial one; some rows lie outside the fitted range.
      const n = 2500;
      const data = Float64Array.from({ length: n * d }, (_, j) => source.mean[j % d] + 1.5 * source.scale[j % d] * r.normal());
      const got = map.apply({ n, d, data });
      let outside = 0;
      for (let i = 0; i < n; i++) {
        let far = false;
        const z = Array.from({ length: d }, (_, k) => {
          let v = data[i * d + k];
          if (v < source.lo[k] || v > source.hi[k]) far = true;
          if (tails === 'clamp') v = Math.min(source.hi[k], Math.max(source.lo[k], v));
          return (v - source.mean[k]) / source.scale[k];
        });
        if (far) outside++;
        const f = closedForm(p, z);
        for (let k = 0; k < d; k++) {
          // Source: the map's definition (fitted-map.ts) with the closed form of arXiv 2111.12187; only the order of float64 operations differs.
          const want = target.mean[k] + target.scale[k] * f[k];
          expect(Math.abs(got.data[i * d + k] - want)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(want)));
        }
      }
      expect(outside).toBeGreaterThan(0);
      expect(got.outside).toBe(outside); // Source: design choice, a row counts once whatever the number of its coordinates outside the range
    },
  );
});
