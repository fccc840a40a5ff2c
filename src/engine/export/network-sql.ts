import { sqlNumber } from './sql-text';

/** A gradient network's parameters as its map JSON stores them (`params.network`), in standardised coordinates. */
export interface NetworkJSON {
  readonly hidden: number;
  readonly layers: number;
  readonly w: readonly number[];
  readonly b: readonly number[];
  readonly c: readonly number[];
  readonly v: readonly number[];
  readonly alpha: number;
  readonly beta: readonly number[];
}

/** Where one side of a gradient-net map sat: centre, one scale, per-column range. */
export interface FrameJSON {
  readonly mean: readonly number[];
  readonly scale: number;
  readonly lo: readonly number[];
  readonly hi: readonly number[];
}

/**
 * Below this the logistic sigmoid is 0 to within 1e-304 (e^-700): inputs are
 * floored here so that EXP never overflows (DuckDB raises an error where
 * JavaScript gives Infinity). Design choice; the change to a result is under
 * 1e-300 in absolute terms.
 */
const SIGMOID_FLOOR = -700;

/**
 * The SQL expressions of a gradient-net map T(x) = m_t + s_t F((x - m_s) / s_s),
 * one per output column, as plain arithmetic with EXP: the same sums in the same
 * order as the engine's float64 network (float64-network.ts, icgn.ts,
 * cascaded-mgn.ts), so results agree with the engine to rounding in EXP (about
 * 1e-15 relative). With tails 'clamp' each input is first held to the fitted
 * source range with GREATEST/LEAST, as the engine does.
 *   layers = 1:  F(z) = beta + (V^T V + alpha I) z + W^T [c (h(W z + b) - h(b))],  h = s^2/2 - s^3/3;
 *   layers >= 2: z_0 = W z + b_0, z_l = W z + s(z_{l-1}) + b_l, F = beta + (V^T V + alpha I) z + W^T [c s(z_{L-1})];
 * s the logistic sigmoid (Richter-Powell, Lorraine & Amos, arXiv 2111.12187;
 * Chaudhari, Pranav & Moura, arXiv 2301.10862).
 * Every output column repeats the hidden layer, so a row costs O(d * hidden * (d + layers)),
 * d times the engine's work; the text is O(d * hidden * (d + layers)) too.
 * @param net, source, target the map's saved parameters (checked by the caller through the method's fromJSON).
 * @param inputs the d input columns as SQL (e.g. `CAST(a AS DOUBLE)`).
 * @param clamp true when tails = clamp.
 * @example networkSQL(net, src, tgt, ['CAST(a AS DOUBLE)'], true) // ['CASE WHEN CAST(a AS DOUBLE) IS NULL THEN NULL ELSE m_t + s_t * (beta + ...) END']
 * A NULL in any input column gives NULL in every output column.
 */
export function networkSQL(net: NetworkJSON, source: FrameJSON, target: FrameJSON, inputs: readonly string[], clamp: boolean): string[] {
  const d = inputs.length;
  const n = sqlNumber;
  const { hidden, layers, w, b, c, v, alpha, beta } = net;
  // Standardised inputs z_k = (x_k - m_k) / s, after clamping to the fitted range.
  const z = inputs.map((x, k) => {
    const held = clamp ? `LEAST(${n(source.hi[k])}, GREATEST(${n(source.lo[k])}, ${x}))` : x;
    return `((${held} - ${n(source.mean[k])}) / ${n(source.scale)})`;
  });
  // V^T V + alpha I, summed as the engine sums it.
  const lin = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      let s = 0;
      for (let r = 0; r < d; r++) s += v[r * d + i] * v[r * d + k];
      lin[i * d + k] = s + (i === k ? alpha : 0);
    }
  }
  const sigmoid = (u: string) => `(1E0 / (1E0 + EXP(-GREATEST(${n(SIGMOID_FLOOR)}, ${u}))))`;
  const act: string[] = [];
  for (let j = 0; j < hidden; j++) {
    if (layers === 1) {
      let u = n(b[j]);
      for (let k = 0; k < d; k++) u = `(${u} + ${n(w[j * d + k])} * ${z[k]})`;
      const s = sigmoid(u);
      const hb = sigmoidEnergy(b[j]);
      // h(u) = s * s * (0.5 - s / 3), as sigmoid-energy.ts writes it.
      act.push(`(${n(c[j])} * ((${s} * ${s} * (5E-1 - ${s} / 3E0)) - ${n(hb)}))`);
    } else {
      let wx = '0E0';
      for (let k = 0; k < d; k++) wx = `(${wx} + ${n(w[j * d + k])} * ${z[k]})`;
      let zz = `(${wx} + ${n(b[j])})`;
      for (let l = 1; l < layers; l++) zz = `((${wx} + ${sigmoid(zz)}) + ${n(b[l * hidden + j])})`;
      act.push(`(${n(c[j])} * ${sigmoid(zz)})`);
    }
  }
  // GREATEST and LEAST skip NULLs in DuckDB and Spark (Trino gives NULL): test for NULL first, the same everywhere.
  const nullTest = inputs.map((x) => `${x} IS NULL`).join(' OR ');
  const out: string[] = [];
  for (let k = 0; k < d; k++) {
    let f = n(beta[k]);
    for (let i = 0; i < d; i++) f = `(${f} + ${n(lin[k * d + i])} * ${z[i]})`;
    for (let j = 0; j < hidden; j++) if (w[j * d + k] !== 0) f = `(${f} + ${n(w[j * d + k])} * ${act[j]})`;
    out.push(`CASE WHEN ${nullTest} THEN NULL ELSE ${n(target.mean[k])} + ${n(target.scale)} * ${f} END`);
  }
  return out;
}

/** h(u) = s^2/2 - s^3/3 at a constant, as the engine computes it (overflow-safe sigmoid). */
function sigmoidEnergy(u: number): number {
  const s = u >= 0 ? 1 / (1 + Math.exp(-u)) : Math.exp(u) / (1 + Math.exp(u));
  return s * s * (0.5 - s / 3);
}
