import { COMPARISON_MAX_ROWS, COMPARISON_SEED } from '../assess';
import { energyDistance } from '../stats/energy-distance';
import { Float64Network } from './float64-network';
import type { NetworkParams } from './network-params';
import type { TrainData } from './train-data';

/**
 * How well a network maps held-out source rows onto held-out target rows: the
 * energy distance (Szekely & Rizzo 2013; stats/energy-distance.ts) between
 * F(source rows) and the target rows, in the target's standardised units, with
 * the rows' weights and the same seeded subsample of at most 1,000 rows per side
 * as the shared fit comparison (assess.ts), so it ranks checkpoints by the figure
 * the diagnostics report. Used to keep the best checkpoint of a training run
 * (the pure Gaussian start included), so training never returns a map that
 * scores worse than where it started. Lower is better; 0 only for equal laws.
 * Cost O(n hidden d + min(n, 1000)^2 d) per call.
 */
export class HeldoutScore {
  private readonly source: TrainData;
  private readonly target: TrainData;
  private readonly mapped: Float64Array;

  /** @param source, target held-out rows in standardised units (not copied; never mutated). */
  constructor(source: TrainData, target: TrainData) {
    this.source = source;
    this.target = target;
    this.mapped = new Float64Array(source.n * source.d);
  }

  /**
   * The score of parameters `p` (finite and >= 0).
   * @example new HeldoutScore(x, y).of(params) // 0.04
   */
  of(p: NetworkParams): number {
    const { n, d, data, weights } = this.source;
    const net = new Float64Network(p);
    const row = new Float64Array(d);
    const out = new Float64Array(d);
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < d; k++) row[k] = data[i * d + k];
      net.forward(row, out);
      this.mapped.set(out, i * d);
    }
    const t = this.target;
    return energyDistance({ n, d, data: this.mapped }, t, weights, t.weights, { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED }).value;
  }
}
