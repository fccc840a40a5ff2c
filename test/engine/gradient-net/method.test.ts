import { tf, useBackend } from './tf-backends';
import { sqrtm, multiply, inv, matrix } from 'mathjs';
import { gradientNetMethod } from '../../../src/engine/gradient-net/method';
import { GradientNetMap } from '../../../src/engine/gradient-net/fitted-map';
import { Random } from '../../../src/engine/stats/random';
import { isRemapError } from '../../../src/engine/errors';
import { resolveSettings } from '../../../src/engine/settings';
import type { Sample } from '../../../src/engine/points';
import type { Progress } from '../../../src/engine/map';
import { fitLinear } from '../../../src/engine/linear/fit';
import { compareFit } from '../../../src/engine/assess';

const settingsOf = (raw: Record<string, unknown>) => resolveSettings('gradient-net', gradientNetMethod.settings, raw);

/** n rows of N(mean, L L^T) with L lower-triangular 2 x 2. */
function gaussian(n: number, mean: number[], l: number[][], seed: number): Sample {
  const r = new Random(seed);
  const data = new Float64Array(n * 2);
  for (let i = 0; i < n; i++) {
    const z0 = r.normal();
    const z1 = r.normal();
    data[i * 2] = mean[0] + l[0][0] * z0;
    data[i * 2 + 1] = mean[1] + l[1][0] * z0 + l[1][1] * z1;
  }
  Object.freeze(data.buffer);
  return Object.freeze({ n, d: 2, data, weights: null });
}

const SRC = gaussian(
  200,
  [0, 0],
  [
    [1, 0],
    [0.3, 0.8],
  ],
  1,
);
const TGT = gaussian(
  200,
  [2, -1],
  [
    [1.5, 0],
    [-0.4, 0.6],
  ],
  2,
);
const SRC_COPY = Float64Array.from(SRC.data);
const FAST = { steps: 20, batch: 64, hidden: 16, time_budget: 30 };

beforeAll(() => useBackend('wasm'));

describe('gradientNetMethod', () => {
  test('declares a joint, weighted, asynchronous method needing max(10, d + 2) rows', () => {
    expect(gradientNetMethod.name).toBe('gradient-net');
    expect(gradientNetMethod.shape).toBe('joint');
    expect(gradientNetMethod.weights).toBe(true);
    // Source: design choice, max(10, d + 2) rows (a held-out split needs rows beyond the d + 2 a covariance needs)
    expect(gradientNetMethod.minRows(2)).toBe(10);
    expect(gradientNetMethod.minRows(12)).toBe(14);
  });

  test.each(['cpu', 'wasm'])('on the %s backend a fit leaves no tensors behind, does not mutate its inputs, and its map needs none', async (backend) => {
    await useBackend(backend as 'cpu' | 'wasm');
    const before = tf.memory().numTensors;
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, backend }), {});
    expect(map.diagnostics().convergence?.criterion).toContain(`on the ${backend} backend`);
    expect(tf.memory().numTensors).toBe(before);
    map.dispose();
    expect(tf.memory().numTensors).toBe(before);
    expect(Array.from(SRC.data)).toEqual(Array.from(SRC_COPY));
  });

  test('the same seed gives bit-identical weights and output; another seed differs', async () => {
    const a = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, seed: 3 }), {});
    const b = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, seed: 3 }), {});
    const c = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, seed: 4 }), {});
    expect(JSON.stringify(a.toJSON().params)).toBe(JSON.stringify(b.toJSON().params));
    expect(Array.from(a.apply(SRC).data)).toEqual(Array.from(b.apply(SRC).data));
    expect(JSON.stringify(a.toJSON().params)).not.toBe(JSON.stringify(c.toJSON().params));
  });

  test('a JSON round trip restores a map with bit-identical results', async () => {
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf(FAST), {});
    const text = JSON.stringify(map.toJSON());
    const back = gradientNetMethod.fromJSON(JSON.parse(text));
    expect(JSON.stringify(back.toJSON())).toBe(text);
    expect(Array.from(back.apply(TGT).data)).toEqual(Array.from(map.apply(TGT).data));
    expect(Array.from(back.invert(TGT).data)).toEqual(Array.from(map.invert(TGT).data));
  });

  test('invert(apply(x)) returns x (Newton on a strongly monotone map)', async () => {
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, tails: 'linear' }), {});
    const back = map.invert(map.apply(SRC));
    for (let i = 0; i < SRC.data.length; i++) expect(back.data[i]).toBeCloseTo(SRC.data[i], 9); // Source: common practice, Newton to 1e-12 relative
  });

  test('records cost, convergence, a positive Jacobian eigenvalue and a not-converged warning when steps run out', async () => {
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf(FAST), {});
    const dg = map.diagnostics();
    expect(dg.cost.kind).toBe('mapped');
    expect(dg.cost.w2).toBeCloseTo(Math.sqrt(dg.cost.w2Squared), 12);
    expect(dg.minJacobianEigenvalue).toBeGreaterThan(0);
    // The record describes the returned checkpoint: a step of the 20 run (checkpoints every 10), or 0 with a warning.
    expect([0, 10, 20]).toContain(dg.convergence?.iterations);
    expect(dg.convergence?.converged).toBe(false);
    expect(dg.warnings.map((w) => w.code)).toContain('not-converged');
    expect(dg.energyAfter).toBeLessThan(dg.energyBefore!);
  });

  test('reports progress and stops with a cancelled RemapError when the signal is aborted', async () => {
    const seen: Progress[] = [];
    const signal = { aborted: false };
    const before = tf.memory().numTensors;
    const run = Promise.resolve(
      gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, steps: 100000 }), {
        signal,
        onProgress: (p) => {
          seen.push(p);
          if (p.step >= 5) signal.aborted = true;
        },
      }),
    );
    await expect(run).rejects.toMatchObject({ kind: 'cancelled' });
    await run.catch((e) => expect(isRemapError(e)).toBe(true));
    expect(seen.length).toBeGreaterThan(0);
    expect(seen[0].of).toBe(100000);
    expect(tf.memory().numTensors).toBe(before);
  });

  test('stops at the time budget with a time-budget warning', async () => {
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, steps: 100000, time_budget: 0.3 }), {});
    const codes = map.diagnostics().warnings.map((w) => w.code);
    expect(codes).toContain('time-budget');
    expect(map.diagnostics().convergence?.converged).toBe(false);
  });

  test('on a Gaussian pair a short training stays close to the closed-form linear map', async () => {
    // Source: Dowson & Landau 1982 / Olkin & Pukelsheim 1982, A = S^-1/2 (S^1/2 T S^1/2)^1/2 S^-1/2 from population covariances.
    const S = matrix([
      [1, 0.3],
      [0.3, 0.09 + 0.64],
    ]);
    const T = matrix([
      [2.25, -0.6],
      [-0.6, 0.16 + 0.36],
    ]);
    const sh = sqrtm(S);
    const shi = inv(sh);
    const A = multiply(multiply(shi, sqrtm(multiply(multiply(sh, T), sh))), shi).toArray() as number[][];
    // units = raw: the closed form above is the map for the plain squared distance.
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, steps: 30, units: 'raw' }), {});
    const probe = { n: 3, d: 2, data: Float64Array.of(0, 0, 1, 0, 0, 1) };
    const out = map.apply(probe).data;
    const exact = [
      [2, -1],
      [2 + A[0][0], -1 + A[1][0]],
      [2 + A[0][1], -1 + A[1][1]],
    ];
    // 200 rows per sample: sampling error of means and covariances is about 0.1-0.2.
    for (let i = 0; i < 3; i++) for (let k = 0; k < 2; k++) expect(Math.abs(out[i * 2 + k] - exact[i][k])).toBeLessThan(0.35);
  });

  test("steps = 0 gives exactly the linear method's map on the same data (to 1e-9, original units)", async () => {
    const lin = fitLinear(SRC, TGT, { ridge: 0, units: 'raw' });
    // units = raw on both sides: the map for the plain squared distance.
    const gn = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, steps: 0, tails: 'linear', units: 'raw' }), {});
    const probe = { n: 3, d: 2, data: Float64Array.of(0, 0, 3, -2, -1.5, 4) };
    for (const x of [SRC, probe]) {
      const a = gn.apply(x).data;
      const b = lin.apply(x).data;
      // Source: Dowson & Landau 1982 -- both are m_t + A (x - m_s) with A from the same weighted moments.
      for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-9 * (1 + Math.abs(b[i])));
    }
  });

  test('energy distances and KS are the shared compareFit figures, so they compare across methods', async () => {
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, steps: 10 }), {});
    const dg = map.diagnostics();
    const ref = compareFit(SRC, null, map.apply(SRC), TGT, null);
    expect(dg.energyBefore).toBe(ref.energyBefore);
    expect(dg.energyAfter).toBe(ref.energyAfter);
    expect(dg.ksMaxAfter).toBe(ref.ksMaxAfter);
    expect(dg.energyBefore).toBe(fitLinear(SRC, TGT, { ridge: 0, units: 'raw' }).diagnostics().energyBefore);
  });

  test('row weights are honoured: zero-weight rows do not count', async () => {
    const w = new Float64Array(200).fill(1);
    for (let i = 0; i < 100; i++) w[i] = 0;
    const weighted = { ...SRC, weights: w };
    const half = { n: 100, d: 2, data: SRC.data.slice(200), weights: null };
    const a = await gradientNetMethod.fit(weighted, TGT, settingsOf({ ...FAST, steps: 0 }), {});
    const b = await gradientNetMethod.fit(half, TGT, settingsOf({ ...FAST, steps: 0 }), {});
    // steps = 0: both are the Gaussian warm start from the same weighted moments.
    const pa = a.apply(TGT).data;
    const pb = b.apply(TGT).data;
    for (let i = 0; i < pa.length; i++) expect(pa[i]).toBeCloseTo(pb[i], 5);
    expect(a).toBeInstanceOf(GradientNetMap);
  });

  test('on a known non-linear optimal map the trained network beats the linear map by a clear factor', async () => {
    // Source N(0, I_2); target grad phi(x') of an independent draw with phi(x) = |x|^2 / 2 + sum_k softplus(w_k . x + b_k),
    // convex and not quadratic, so grad phi is the optimal map (Brenier 1991) and L2-UVP (Korotin et al. 2021) can be scored on fresh rows.
    const W = [
      [3, 0],
      [0, 3],
      [2, -2],
    ];
    const B = [0.5, -0.5, 0];
    const gradPhi = (x: Float64Array): Float64Array => {
      const out = Float64Array.from(x);
      for (let i = 0; i < x.length / 2; i++) {
        for (let k = 0; k < W.length; k++) {
          const s = 1 / (1 + Math.exp(-(W[k][0] * x[2 * i] + W[k][1] * x[2 * i + 1] + B[k])));
          out[2 * i] += s * W[k][0];
          out[2 * i + 1] += s * W[k][1];
        }
      }
      return out;
    };
    const draw = (n: number, seed: number) => {
      const r = new Random(seed);
      return Float64Array.from({ length: 2 * n }, () => r.normal());
    };
    const src: Sample = { n: 600, d: 2, data: draw(600, 21), weights: null };
    const tgt: Sample = { n: 600, d: 2, data: gradPhi(draw(600, 22)), weights: null };
    const test = draw(1000, 23);
    const exact = gradPhi(test);
    let variance = 0;
    for (let k = 0; k < 2; k++) {
      let m = 0;
      for (let i = 0; i < 600; i++) m += tgt.data[2 * i + k] / 600;
      for (let i = 0; i < 600; i++) variance += (tgt.data[2 * i + k] - m) ** 2 / 600;
    }
    const uvp = (map: { apply: (p: { n: number; d: number; data: Float64Array }) => { data: Float64Array } }) => {
      const out = map.apply({ n: 1000, d: 2, data: test }).data;
      let s = 0;
      for (let i = 0; i < out.length; i++) s += (out[i] - exact[i]) ** 2;
      return (100 * s) / 1000 / variance;
    };
    const before = tf.memory().numTensors;
    const linear = fitLinear(src, tgt, { ridge: 0 });
    const net = await gradientNetMethod.fit(src, tgt, settingsOf({ steps: 300, hidden: 32, seed: 1, time_budget: 60 }), {});
    expect(tf.memory().numTensors).toBe(before);
    // Design choice: a clear factor of 2 (the trained map reaches several times below the linear map here).
    expect(uvp(net)).toBeLessThan(uvp(linear) / 2);
    expect(net.diagnostics().warnings.map((w) => w.code)).not.toContain('kept-linear-start');
  });

  test('when training cannot beat the linear start, the linear map comes back with a warning in words', async () => {
    // A Gaussian pair: the linear map is already optimal, and a learning rate of 1e-7 leaves the small random start in place.
    const map = await gradientNetMethod.fit(SRC, TGT, settingsOf({ ...FAST, start: 'gaussian', learning_rate: 1e-7 }), {});
    const dg = map.diagnostics();
    expect(dg.warnings.map((w) => w.code)).toContain('kept-linear-start');
    expect(dg.convergence?.converged).toBe(false);
    expect(dg.convergence?.iterations).toBe(0);
  });
});
