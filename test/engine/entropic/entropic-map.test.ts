import { EntropicMap } from '../../../src/engine/entropic/entropic-map';
import { fitEntropic } from '../../../src/engine/entropic/fit';
import { RemapError } from '../../../src/engine/errors';
import type { MapJSON } from '../../../src/engine/map';
import { points, type Sample } from '../../../src/engine/points';

function uniformSample(n: number, d: number, seed: number, lo: number, hi: number): Sample {
  let s = seed >>> 0;
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    data[i] = lo + ((hi - lo) * s) / 4294967296;
  }
  return { n, d, data, weights: null };
}

describe('EntropicMap', () => {
  const source = uniformSample(80, 2, 1, 0, 1);
  const target = uniformSample(90, 2, 2, 10, 12);
  const map = fitEntropic(source, target, { smoothing: 0.02 });

  test('toJSON then fromJSON gives bit-identical apply and invert results and the same diagnostics', () => {
    const text = JSON.stringify(map.toJSON());
    const back = EntropicMap.fromJSON(JSON.parse(text) as MapJSON);
    const probe = uniformSample(10, 2, 3, -0.5, 1.5);
    expect(Array.from(back.apply(probe).data)).toEqual(Array.from(map.apply(probe).data));
    const inside = uniformSample(10, 2, 3, 10.5, 11.5);
    expect(Array.from(back.invert(inside).data)).toEqual(Array.from(map.invert(inside).data));
    expect(back.cost()).toEqual(map.cost());
    expect(back.diagnostics().settings).toEqual(map.diagnostics().settings);
  });

  test('apply maps into the convex hull of the target; outside counts rows beyond the fitted source range', () => {
    const r = map.apply(
      points([
        [0.5, 0.5],
        [2, 0.5],
        [-1, -1],
      ]),
    );
    expect(r.outside).toBe(2);
    for (let i = 0; i < r.data.length; i++) {
      expect(r.data[i]).toBeGreaterThanOrEqual(10);
      expect(r.data[i]).toBeLessThanOrEqual(12);
    }
  });

  test('invert is the exact inverse of apply: round trips on fresh rows agree to 1e-8 (x) and 1e-9 (y)', () => {
    // Source: T is the gradient of a strictly convex function, hence one to one on its domain. Newton stops when
    // |T(x) - y| <= 1e-10 (1 + |y|) (design choice) and apply truncates at 1e-10 of the target's diameter (2 here), so
    // y round trips to about 3e-10 x 11; x moves by that over the Jacobian's smallest eigenvalue (about 0.3 here): 1e-8.
    const x = uniformSample(40, 2, 11, 0.05, 0.95);
    const back = map.invert(map.apply(x));
    for (let i = 0; i < x.data.length; i++) expect(Math.abs(back.data[i] - x.data[i])).toBeLessThan(1e-8);
    const y = map.apply(uniformSample(40, 2, 12, -0.2, 1.2));
    const again = map.apply(map.invert(y));
    for (let i = 0; i < y.data.length; i++) expect(Math.abs(again.data[i] - y.data[i])).toBeLessThan(5e-9);
  });

  test('invert refuses a value outside the convex hull of the target rows (no preimage), naming the row', () => {
    // Source: every value of the entropic map is an average of target rows (Pooladian & Niles-Weed 2021, eq. (3.2)).
    expect(() =>
      map.invert(
        points([
          [11, 11],
          [20, 11],
        ]),
      ),
    ).toThrow(/row 2 of the values \(20, 11\)/);
  });

  test('apply in standardised units equals the raw-units fit of the data divided by the pooled spreads, mapped back', () => {
    // Source: fitting in standardised units is defined as fitting D x and D y and undoing D (column-scales.ts); here
    // one column is multiplied by 1000 in both samples, which standardised fitting must not notice beyond rounding.
    const stretched = (s: Sample): Sample => ({ ...s, data: s.data.map((v, i) => (i % 2 === 1 ? 1000 * v : v)) });
    const a = fitEntropic(source, target, { smoothing: 0.05 });
    const b = fitEntropic(stretched(source), stretched(target), { smoothing: 0.05 });
    const probe = uniformSample(20, 2, 13, 0, 1);
    const pa = a.apply(probe).data;
    const pb = b.apply(stretched({ ...probe, weights: null })).data;
    // 1e-8 on values near 11: the divisions by the pooled spreads round differently, and 1 / smoothing = 20 amplifies it.
    for (let i = 0; i < pa.length; i++) expect(Math.abs((i % 2 === 1 ? pb[i] / 1000 : pb[i]) - pa[i])).toBeLessThan(1e-8);
    // In raw units the stretched column dominates the cost and the fit differs.
    const raw = fitEntropic(stretched(source), stretched(target), { smoothing: 0.05, units: 'raw' }).apply(stretched({ ...probe, weights: null })).data;
    let moved = 0;
    for (let i = 0; i < pa.length; i += 2) moved = Math.max(moved, Math.abs(raw[i] - pa[i]));
    expect(moved).toBeGreaterThan(0.01);
  });

  test('apply checks the column count and finiteness, and never mutates its input', () => {
    const x = points([[0.1, 0.2]]);
    const copy = Float64Array.from(x.data);
    map.apply(x);
    expect(x.data).toEqual(copy);
    expect(() => map.apply(points([[1, 2, 3]]))).toThrow(RemapError);
    expect(() => map.apply(points([[NaN, 1]]))).toThrow(/non-finite/);
  });

  test('fromJSON refuses parameters of inconsistent lengths', () => {
    const json = map.toJSON();
    const broken = { ...json, params: { ...(json.params as object), g: [1, 2] } } as MapJSON;
    expect(() => EntropicMap.fromJSON(broken)).toThrow(/inconsistent lengths/);
    expect(() => EntropicMap.fromJSON({ ...json, params: null } as MapJSON)).toThrow(RemapError);
  });
});
