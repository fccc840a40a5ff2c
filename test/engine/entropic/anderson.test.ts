import { AndersonMixer } from '../../../src/engine/entropic/anderson';

/** x <- M x + c for a fixed 3 x 3 contraction M (spectral radius < 1); its fixed point solves (I - M) x = c. */
function linearMap(x: Float64Array): Float64Array {
  const M = [
    [0.9, 0.05, 0],
    [0.05, 0.8, 0.1],
    [0, 0.1, 0.95],
  ];
  const c = [1, -2, 0.5];
  return Float64Array.from(M.map((row, i) => row[0] * x[0] + row[1] * x[1] + row[2] * x[2] + c[i]));
}

describe('AndersonMixer', () => {
  test('on a linear fixed-point map in 3 dimensions it reaches the fixed point within a few steps, where the plain iteration is far off', () => {
    // Source: Walker & Ni 2011 ("Anderson acceleration for fixed-point iterations", SIAM J. Numer. Anal. 49), section 4:
    // on a linear problem Anderson acceleration with memory >= p is essentially GMRES, exact after at most p + 1 steps in p unknowns.
    // The fixed point, solved by hand from (I - M) x = c with the matrix above and checked by substitution: see `residual` below.
    const mixer = new AndersonMixer(3, 5);
    let x: Float64Array = new Float64Array(3);
    for (let k = 0; k < 6; k++) {
      const gx = linearMap(x);
      const next = new Float64Array(3);
      mixer.step(x, gx, next);
      x = next;
    }
    const residual = (v: Float64Array): number => Math.hypot(...linearMap(v).map((g, i) => g - v[i]));
    expect(residual(x)).toBeLessThan(1e-9);
    let plain: Float64Array = new Float64Array(3);
    for (let k = 0; k < 6; k++) plain = linearMap(plain);
    expect(residual(plain)).toBeGreaterThan(0.1);
  });

  test('with an empty history (first step, or after reset) the step is the plain one, x <- G(x)', () => {
    // Source: Walker & Ni 2011, Algorithm AA with m_k = 0 is the fixed-point iteration.
    const mixer = new AndersonMixer(3, 4);
    const x = Float64Array.of(1, 2, 3);
    const out = new Float64Array(3);
    mixer.step(x, linearMap(x), out);
    expect(Array.from(out)).toEqual(Array.from(linearMap(x)));
    mixer.step(out, linearMap(out), new Float64Array(3));
    mixer.reset();
    const again = new Float64Array(3);
    mixer.step(x, linearMap(x), again);
    expect(Array.from(again)).toEqual(Array.from(linearMap(x)));
  });
});
