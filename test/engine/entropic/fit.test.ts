import { fitEntropic } from '../../../src/engine/entropic/fit';
import { RemapError } from '../../../src/engine/errors';
import type { Progress } from '../../../src/engine/map';
import type { Sample } from '../../../src/engine/points';

function normalSample(n: number, d: number, seed: number, scale = 1, shift = 0, weights: Float64Array | null = null): Sample {
  let s = seed >>> 0;
  const u = (): number => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) data[i] = shift + scale * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return { n, d, data, weights };
}

describe('fitEntropic', () => {
  const source = normalSample(120, 2, 1);
  const target = normalSample(100, 2, 2, 1.5, 2);

  test('records the smoothing (eps) actually used in the settings, and the cost as 2 x the Sinkhorn divergence', () => {
    const map = fitEntropic(source, target, {});
    const diag = map.diagnostics();
    expect(diag.settings.smoothing).toBeGreaterThan(0);
    expect(diag.settings.smoothing).toBe(map.parts.eps);
    expect(diag.cost.kind).toBe('sinkhorn-divergence');
    expect(diag.cost.w2).toBeCloseTo(Math.sqrt(diag.cost.w2Squared), 14);
    expect(diag.cost.note).toMatch(/Twice the debiased Sinkhorn divergence/);
    expect(diag.cost.note).toMatch(/biased downward/);
    expect(diag.convergence?.converged).toBe(true);
    // Source: the stopping rule at the default tolerance (1e-4 since the speed work; it was 1e-6).
    expect(diag.convergence?.finalError).toBeLessThan(1e-4);
    expect(diag.minJacobianEigenvalue).toBeGreaterThanOrEqual(-1e-12);
    expect(fitEntropic(source, target, { smoothing: 0.3 }).diagnostics().settings.smoothing).toBe(0.3);
  });

  test('the same inputs and seed give bit-identical maps, and inputs are not mutated', () => {
    const copies = [source.data, target.data].map((a) => Float64Array.from(a));
    const a = fitEntropic(source, target, { seed: 5 });
    const b = fitEntropic(source, target, { seed: 5 });
    expect(Array.from(a.apply(source).data)).toEqual(Array.from(b.apply(source).data));
    expect(a.diagnostics().minJacobianEigenvalue).toBe(b.diagnostics().minJacobianEigenvalue);
    expect([source.data, target.data]).toEqual(copies);
  });

  test('zero-weight rows are ignored: the fit equals the fit without them', () => {
    const w = Float64Array.from({ length: 120 }, (_, i) => (i % 4 === 0 ? 0 : 1));
    const weighted = fitEntropic({ ...source, weights: w }, target, { smoothing: 0.3 });
    const keep = Array.from({ length: 120 }, (_, i) => i).filter((i) => i % 4 !== 0);
    const data = new Float64Array(keep.length * 2);
    keep.forEach((i, r) => data.set(source.data.subarray(2 * i, 2 * i + 2), 2 * r));
    const reduced = fitEntropic({ n: keep.length, d: 2, data, weights: null }, target, { smoothing: 0.3 });
    const probe = normalSample(5, 2, 9);
    const pa = weighted.apply(probe).data;
    const pb = reduced.apply(probe).data;
    for (let i = 0; i < pa.length; i++) expect(Math.abs(pa[i] - pb[i])).toBeLessThan(1e-8);
  });

  test('a fit that runs out of iterations warns not-converged and says what to do', () => {
    const map = fitEntropic(source, target, { smoothing: 0.001, max_iterations: 5 });
    const w = map.diagnostics().warnings.find((x) => x.code === 'not-converged');
    expect(w).toBeDefined();
    expect(w?.action).toMatch(/max_iterations/);
    expect(w?.action).toMatch(/smoothing/);
    expect(map.diagnostics().convergence?.converged).toBe(false);
  });

  test('progress is reported with step, of and the marginal error as loss', () => {
    const seen: Progress[] = [];
    fitEntropic(source, target, { smoothing: 0.3 }, { onProgress: (p) => seen.push(p) });
    expect(seen.length).toBeGreaterThan(0);
    expect(seen[0].of).toBe(3000);
    expect(seen.every((p) => p.step >= 1 && p.elapsedMs >= 0)).toBe(true);
  });

  test('cancellation throws RemapError of kind cancelled', () => {
    let caught: unknown;
    try {
      fitEntropic(source, target, {}, { signal: { aborted: true } });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(RemapError);
    expect((caught as RemapError).kind).toBe('cancelled');
  });

  test('more than 5,000 rows of positive weight is refused with advice', () => {
    const big: Sample = { n: 5001, d: 1, data: new Float64Array(5001), weights: null };
    expect(() => fitEntropic(big, big, {})).toThrow(/at most 5,000 rows/);
  });

  test('small samples carry the small-sample warning; dropped rows are reported', () => {
    const map = fitEntropic(normalSample(6, 2, 3), normalSample(6, 2, 4), {}, { dropped: { source: 1, target: 0 } });
    const codes = map.diagnostics().warnings.map((w) => w.code);
    expect(codes).toContain('small-sample');
    expect(codes).toContain('rows-dropped');
  });
});
