import { sample } from '../../src/engine/points';
import { Random } from '../../src/engine/stats/random';
import { boundsBand } from '../../src/taskpane/bounds-band';

describe('boundsBand (the pane\'s "show 95 % bounds")', () => {
  const r = new Random(9);
  const z = Array.from({ length: 400 }, () => r.normal());
  const w = Array.from({ length: 500 }, () => r.normal());
  const src = sample(z);
  const tgt = sample(w.map((v) => 2 * v + 10));

  test('where the population map is exactly 2x + 10, the band at the middle probabilities holds the population value', () => {
    // Source: N(0,1) -> N(10, 4) by the map 2x + 10 (the Gaussian quantile map, fact of the trade); a 95 % band covers it at most points
    const band = boundsBand('quantile', src, tgt, {}, { replicates: 199, seed: 3, points: 21 })!;
    expect(band.x).toHaveLength(21);
    let covered = 0;
    for (let k = 0; k < 21; k++) {
      const p = (k + 0.5) / 21;
      const xs = [...z].sort((a, b) => a - b)[Math.min(399, Math.floor(p * 400))];
      const truth = 2 * xs + 10;
      if (band.lower[k] <= truth && truth <= band.upper[k]) covered++;
    }
    expect(covered).toBeGreaterThanOrEqual(17);
  });

  test('the same data and seed give the same band; several columns or a method without bounds give none', () => {
    // Source: design choice (seeded randomness; bounds exist for the 1-D methods)
    const a = boundsBand('quantile', src, tgt, {}, { replicates: 50, seed: 1 })!;
    const b = boundsBand('quantile', src, tgt, {}, { replicates: 50, seed: 1 })!;
    expect(Array.from(a.lower)).toEqual(Array.from(b.lower));
    expect(boundsBand('entropic', src, tgt, {})).toBeNull();
    expect(boundsBand('quantile', { n: 2, d: 2, data: Float64Array.of(1, 2, 3, 4), weights: null }, tgt, {})).toBeNull();
  });
});
