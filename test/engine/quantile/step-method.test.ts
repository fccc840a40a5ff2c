import { prepareFit } from '../../../src/engine/methods';
import { column, sample, type Sample } from '../../../src/engine/points';
import { stepMethod } from '../../../src/engine/quantile/step-method';
import type { TransportMap } from '../../../src/engine/map';

function fit(s: Sample, t: Sample, raw: Record<string, unknown> = {}): TransportMap {
  return stepMethod.fit(s, t, prepareFit(stepMethod, s, t, raw), {}) as TransportMap;
}
const apply = (m: TransportMap, xs: number[]) => Array.from(m.apply(column(xs)).data);

describe('step method', () => {
  test('the spec: one-column, weights, 2 rows minimum', () => {
    expect(stepMethod.name).toBe('step');
    expect(stepMethod.shape).toBe('one-column');
    expect(stepMethod.weights).toBe(true);
    expect(stepMethod.minRows(3)).toBe(2);
  });

  test('equal sizes map x_(i) to y_(i), and values between hold the lower one', () => {
    const m = fit(sample(Object.freeze([3, 1, 2])), sample(Object.freeze([30, 10, 20])));
    expect(apply(m, [1, 2, 3, 1.5, 2.99])).toEqual([10, 20, 30, 10, 20]);
  });

  test('every result is a target sample value: T(x) = G^-1(F(x))', () => {
    const y = [10, 20, 40];
    const m = fit(sample([1, 2, 3, 4, 5, 6]), sample(y));
    // Source: by hand, F = 1/6..1 and G^-1 takes 10 up to 1/3, 20 up to 2/3, then 40
    expect(apply(m, [1, 2, 3, 4, 5, 6])).toEqual([10, 10, 20, 20, 40, 40]);
  });

  test('the inverse is F^-1(G(y))', () => {
    const m = fit(sample([1, 2, 3, 4]), sample([10, 20]));
    expect(Array.from(m.invert(column([10, 15, 20])).data)).toEqual([2, 2, 4]); // Source: by hand, G = 1/2, 1/2, 1
  });

  test('a weight of 2 maps exactly like the row given twice', () => {
    const weighted = fit(sample([1, 2, 3], [2, 1, 1]), sample([5, 6, 7, 8]));
    const doubled = fit(sample([1, 1, 2, 3]), sample([5, 6, 7, 8]));
    const probe = [0, 1, 1.5, 2, 2.5, 3, 4];
    expect(apply(weighted, probe)).toEqual(apply(doubled, probe));
    const tw = fit(sample([5, 6, 7, 8]), sample([1, 2, 3], [2, 1, 1]));
    const td = fit(sample([5, 6, 7, 8]), sample([1, 1, 2, 3]));
    expect(apply(tw, [5, 6, 7, 8])).toEqual(apply(td, [5, 6, 7, 8]));
    expect(tw.cost().w2Squared).toBe(td.cost().w2Squared);
  });

  test('zero-weight rows do not count', () => {
    const a = fit(sample([1, 2, 3, 100], [1, 1, 1, 0]), sample([10, 20, 30]));
    expect(apply(a, [3])).toEqual([30]);
    expect(a.apply(column([100])).outside).toBe(1);
  });

  test('tails: clamp holds the end values, linear continues the end chords', () => {
    const clamp = fit(sample([0, 1, 2]), sample([0, 10, 20]));
    const linear = fit(sample([0, 1, 2]), sample([0, 10, 20]), { tails: 'linear' });
    expect(apply(clamp, [-1, 3])).toEqual([0, 20]);
    expect(apply(linear, [-1, 3])).toEqual([-10, 30]); // Source: by hand, chord slope 10
  });

  test('minJacobianEigenvalue is 0 for a step function', () => {
    expect(fit(sample([0, 1, 2]), sample([0, 10, 20])).diagnostics().minJacobianEigenvalue).toBe(0);
  });

  test('toJSON / fromJSON is bit-identical', () => {
    const m = fit(sample([0.1, 0.7, 0.3, 2.2, 1.9]), sample([5, 9, 1, 3]));
    const back = stepMethod.fromJSON(JSON.parse(JSON.stringify(m.toJSON())));
    const probe = column([-1, 0.1, 0.5, 1, 2, 3, 4, 9, 5]);
    expect(Array.from(back.apply(probe).data)).toEqual(Array.from(m.apply(probe).data));
    expect(Array.from(back.invert(probe).data)).toEqual(Array.from(m.invert(probe).data));
  });
});
