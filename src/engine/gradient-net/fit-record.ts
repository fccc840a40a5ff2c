import type { CostReport, Convergence, FitRecord, Warning } from '../map';
import type { Sample } from '../points';
import { compareFit } from '../assess';
import type { Frame } from './fitted-map';
import { Float64Network } from './float64-network';
import { smallestEigenvalue } from '../stats/smallest-eigenvalue';
import type { NetworkParams } from './network-params';
import type { TrainResult } from './train';

/**
 * What a gradient-net fit records: mapped source rows T(x_i) (float64, no
 * clamping: source rows lie in the source range), the cost as the weighted mean
 * squared displacement |T(x) - x|^2 (kind 'mapped'; since T is the gradient of a
 * convex function it is the optimal map from the source to its image, so this is
 * exactly the squared W2 between the source and the mapped source), the smallest
 * eigenvalue of the analytic Jacobian over the source rows (Jacobi), energy
 * distance before/after and the largest per-column Kolmogorov-Smirnov statistic
 * after, by the shared compareFit (assess.ts: the same rows, weights, units and
 * subsample as every other method, so the figures compare across methods), the
 * training convergence and warnings. Cost O(n hidden d^2 + n d^3 + min(n, 1000)^2 d
 * + d (n + m) log(n + m)).
 */
export function fitRecordOf(
  source: Sample,
  target: Sample,
  params: NetworkParams,
  sf: Frame,
  tf: Frame,
  result: TrainResult,
  settings: { steps: number; timeBudget: number; blur: number },
  baseWarnings: readonly Warning[],
): FitRecord {
  const { n, d, data, weights } = source;
  const net = new Float64Network(params);
  const mapped = new Float64Array(n * d);
  const row = new Float64Array(d);
  const f = new Float64Array(d);
  const jac = new Float64Array(d * d);
  const ratio = tf.scale / sf.scale;
  let total = 0;
  let moved = 0;
  let minEig = Infinity;
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < d; k++) row[k] = (data[i * d + k] - sf.mean[k]) / sf.scale;
    net.forward(row, f);
    let s = 0;
    for (let k = 0; k < d; k++) {
      const y = tf.mean[k] + tf.scale * f[k];
      mapped[i * d + k] = y;
      s += (y - data[i * d + k]) ** 2;
    }
    const w = weights ? weights[i] : 1;
    total += w;
    moved += w * s;
    net.jacobian(row, jac);
    minEig = Math.min(minEig, ratio * smallestEigenvalue(jac, d));
  }
  const w2Squared = moved / total;
  const cost: CostReport = {
    kind: 'mapped',
    w2Squared,
    w2: Math.sqrt(w2Squared),
    note: 'Mean squared displacement |T(x) - x|^2 over the weighted source rows; the map is a gradient of a convex function, so this is the squared W2 between the source and the mapped source.',
  };
  const { energyBefore, energyAfter, ksMaxAfter } = compareFit(source, weights, { n, d, data: mapped }, target, target.weights);
  const kept =
    result.steps === 0
      ? 'no training (steps = 0): the Gaussian linear map'
      : result.keptStep === 0
        ? `no checkpoint beat the Gaussian linear map on the held-out energy distance (${fmt(result.startScore)}), so that map was kept`
        : `kept the weights of step ${result.keptStep}, held-out energy distance ${fmt(result.keptScore)} against ${fmt(result.startScore)} for the Gaussian linear map`;
  const convergence: Convergence = {
    iterations: result.steps,
    finalError: result.finalLoss,
    converged: result.stopped === 'plateau' || result.stopped === 'no-gain',
    criterion: `smoothed debiased Sinkhorn divergence between mapped source and target batches (standardised units, blur ${settings.blur}); training stopped by ${result.stopped} on the ${result.backend} backend${result.backendFallback ? ` because wasm failed: ${result.backendFallback}` : ''}; ${kept} (energy in target-standardised units)`,
  };
  const warnings: Warning[] = [...baseWarnings];
  if (result.stopped === 'time-budget') {
    warnings.push({
      code: 'time-budget',
      message: `Training stopped after ${result.steps} of ${settings.steps} steps when the time budget of ${settings.timeBudget} s ran out; the map may be under-trained.`,
      action: 'Raise time_budget, lower batch or hidden, or keep backend=wasm; then compare the convergence figures.',
    });
  } else if (result.stopped === 'steps' && settings.steps > 0) {
    warnings.push({
      code: 'not-converged',
      message: `Training used all ${result.steps} steps before the loss levelled off; the map may be under-trained.`,
      action: 'Raise steps (or learning_rate) and refit; the fit is converged when the convergence record says so.',
    });
  }
  return { cost, energyBefore, energyAfter, ksMaxAfter, minJacobianEigenvalue: minEig, convergence, warnings };
}

function fmt(x: number): string {
  return Number.isFinite(x) ? x.toPrecision(3) : String(x);
}
