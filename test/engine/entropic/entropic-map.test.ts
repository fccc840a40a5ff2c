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
  const map = fitEntropic(source, target, { eps: 0.02 });

  test('toJSON then fromJSON gives bit-identical apply and invert results and the same diagnostics', () => {
    const text = JSON.stringify(map.toJSON());
    const back = EntropicMap.fromJSON(JSON.parse(text) as MapJSON);
    const probe = uniformSample(10, 2, 3, -0.5, 1.5);
    expect(Array.from(back.apply(probe).data)).toEqual(Array.from(map.apply(probe).data));
    expect(Array.from(back.invert(probe).data)).toEqual(Array.from(map.invert(probe).data));
    expect(back.cost()).toEqual(map.cost());
    expect(back.diagnostics().settings).toEqual(map.diagnostics().settings);
  });

  test('apply maps into the convex hull of the target; outside counts rows beyond the fitted source range', () => {
    const r = map.apply(points([[0.5, 0.5], [2, 0.5], [-1, -1]]));
    expect(r.outside).toBe(2);
    for (let i = 0; i < r.data.length; i++) {
      expect(r.data[i]).toBeGreaterThanOrEqual(10);
      expect(r.data[i]).toBeLessThanOrEqual(12);
    }
  });

  test('invert is the reverse entropic map: it lands in the source range and roughly undoes apply', () => {
    const x = points([[0.3, 0.6], [0.7, 0.2]]);
    const back = map.invert(map.apply(x));
    expect(back.outside).toBe(0);
    // Source: for an eps small against the spread, the reverse map approximately inverts the forward one.
    for (let i = 0; i < 4; i++) expect(Math.abs(back.data[i] - x.data[i])).toBeLessThan(0.15);
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
