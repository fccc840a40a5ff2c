import { extrapolationWarning } from '../../../src/engine/outside';
import { parseMapJSON } from '../../../src/engine/map-json';
import { fitLinear } from '../../../src/engine/linear/fit';
import { LinearMap } from '../../../src/engine/linear/linear-map';
import type { MapJSON } from '../../../src/engine/map';
import type { Sample } from '../../../src/engine/points';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

function randomSample(n: number, d: number, seed: number, shift: number): Sample {
  const u = rng(seed);
  return { n, d, data: Float64Array.from({ length: n * d }, (_, j) => shift + ((j % d) + 1) * u() * u() + u()), weights: null };
}

const s = randomSample(120, 3, 1, 0);
const t = randomSample(90, 3, 2, 4);
const x = randomSample(60, 3, 3, -0.5);

describe('LinearMap: apply, invert, diagnostics and JSON', () => {
  test('toJSON -> text -> parseMapJSON -> fromJSON gives bit-identical apply and invert', () => {
    const map = fitLinear(s, t, { tails: 'clamp', ridge: 0 });
    const json = map.toJSON();
    expect(JSON.parse(JSON.stringify(json.params))).toEqual(json.params);
    const back = LinearMap.fromJSON(parseMapJSON(JSON.stringify(json)));
    expect(back.apply(x).data).toEqual(map.apply(x).data);
    expect(back.invert(x).data).toEqual(map.invert(x).data);
    expect(Object.is(back.apply(x).data[0], map.apply(x).data[0])).toBe(true);
    expect(back.cost()).toEqual(map.cost());
    expect(back.toJSON()).toEqual(JSON.parse(JSON.stringify(json)));
  });

  test('params() are plain arrays of finite numbers with the documented lengths', () => {
    const p = fitLinear(s, t, { ridge: 0 }, {}, { compare: false }).toJSON().params as Record<string, unknown>;
    for (const f of ['mean1', 'mean2', 'sourceMin', 'sourceMax', 'targetMin', 'targetMax']) expect((p[f] as number[]).length).toBe(3);
    for (const f of ['cov1', 'cov2', 'matrix', 'inverse']) expect((p[f] as number[]).length).toBe(9);
    for (const v of Object.values(p)) expect(Array.isArray(v) && (v as number[]).every(Number.isFinite)).toBe(true);
  });

  test('-0 in the parameters is stored as 0, so a fitted map and its restored copy have equal JSON', () => {
    const map = fitLinear(s, t, { ridge: 0 }, {}, { compare: false });
    const json = map.toJSON();
    const params = { ...(json.params as unknown as Record<string, number[]>), mean2: [-0, -0, -0] } as unknown as ConstructorParameters<typeof LinearMap>[2];
    const a = new LinearMap(map.header, map.fitted, params);
    expect(Object.is((a.toJSON().params as { mean2: number[] }).mean2[0], 0)).toBe(true);
    const b = LinearMap.fromJSON(JSON.parse(JSON.stringify(a.toJSON())) as MapJSON);
    expect(b.toJSON()).toEqual(a.toJSON());
  });

  test('outside counts rows beyond the source range (apply) or target range (invert) per call; the warning says the affine map continues', () => {
    const map = fitLinear(s, t, { ridge: 0 }, {}, { compare: false });
    const before = JSON.stringify(map.diagnostics());
    const far = { n: 2, d: 3, data: Float64Array.from([0.5, 0.5, 0.5, 100, 0.5, 0.5]) };
    const applied = map.apply(far);
    expect(applied.outside).toBe(1);
    expect(map.invert(far).outside).toBe(2);
    // Source: design choice (a map's report holds fit-time facts only, whatever was applied since)
    expect(JSON.stringify(map.diagnostics())).toBe(before);
    const w = extrapolationWarning(map, applied);
    expect(w?.code).toBe('extrapolation');
    expect(w?.message).toMatch(/^1 of 2 rows \(50\.0%\) lay outside the source range the linear map was fitted on; for them, the same affine map continues/);
    expect(extrapolationWarning(map, map.apply({ n: 1, d: 3, data: Float64Array.from([0.5, 0.5, 0.5]) }))).toBeNull();
  });

  test('a far value moves by the same affine rule: T(x) = m2 + A (x - m1) checked by hand at a point 100 units out', () => {
    const map = fitLinear(s, t, { ridge: 0 }, {}, { compare: false });
    const { mean1, mean2, matrix } = map.parameters;
    const x = [100, -100, 5];
    const got = Array.from(map.apply({ n: 1, d: 3, data: Float64Array.from(x) }).data);
    for (let l = 0; l < 3; l++) {
      let v = mean2[l];
      for (let k = 0; k < 3; k++) v += matrix[l * 3 + k] * (x[k] - mean1[k]);
      expect(got[l]).toBeCloseTo(v, 9); // Source: the map's formula T(x) = m2 + A (x - m1) (Knott & Smith 1984), evaluated separately
    }
  });

  test('a wrong column count is refused by apply', () => {
    const map = fitLinear(s, t, { ridge: 0 }, {}, { compare: false });
    expect(() => map.apply({ n: 1, d: 2, data: Float64Array.from([1, 2]) })).toThrow(/fitted on 3/);
  });

  test('fromJSON refuses parameters of the wrong shape', () => {
    const json = fitLinear(s, t, { ridge: 0 }, {}, { compare: false }).toJSON();
    const broken = { ...json, params: { ...(json.params as object), matrix: [1, 2, 3] } };
    expect(() => LinearMap.fromJSON(broken)).toThrow(/"params.matrix" is not a list of 9 numbers/);
    expect(() => LinearMap.fromJSON({ ...json, params: null })).toThrow(/"params" is not an object/);
    const nonNumber = { ...json, params: { ...(json.params as object), mean1: [1, 'a', 3] } };
    expect(() => LinearMap.fromJSON(nonNumber as MapJSON)).toThrow(/"params.mean1" holds a value that is not a finite number/);
  });

  test('apply does not mutate its input', () => {
    const map = fitLinear(s, t, { ridge: 0 }, {}, { compare: false });
    const copy = Float64Array.from(x.data);
    map.apply(Object.freeze(x));
    map.invert(x);
    expect(x.data).toEqual(copy);
  });
});
