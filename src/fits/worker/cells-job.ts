import type { Progress } from '../../engine/map';
import type { Sample } from '../../engine/points';
import { fitFromInputs } from '../fit-service';
import { readFit } from '../read-fit';
import type { FitDone, FitRequest, PlotSample } from './messages';
import { PLOT_MAX_ROWS } from './messages';

/**
 * One fit as the pane runs it, in the worker or (without workers) on the page:
 * the same reading of cells and the same handle as REMAP.FIT, then the map's
 * JSON, its diagnostics, and thinned samples for the plots.
 * Cost: that of the fit, plus applying the map to at most PLOT_MAX_ROWS rows.
 * @throws RemapError as REMAP.FIT would (bad input, cancelled, over the time budget).
 */
export async function runFitJob(req: FitRequest, onProgress: (p: Progress) => void, signal?: { readonly aborted: boolean }): Promise<FitDone> {
  const t0 = Date.now();
  const inputs = readFit('REMAP.FIT', {
    source: req.source,
    target: req.target,
    method: req.method,
    settings: req.settings || null,
    sourceWeights: req.sourceWeights,
    targetWeights: req.targetWeights,
  });
  const map = await fitFromInputs(inputs, { onProgress, signal });
  const diagnostics = map.diagnostics();
  const json = JSON.stringify(map.toJSON());
  const source = thin(inputs.source.sample);
  const target = thin(inputs.target.sample);
  const mappedPoints = map.apply({ n: source.n, d: source.d, data: source.data });
  return {
    type: 'done',
    id: req.id,
    handle: inputs.handle,
    method: inputs.method,
    reason: inputs.reason,
    json,
    diagnostics,
    columns: inputs.source.columns ?? inputs.target.columns,
    source,
    mapped: { n: source.n, d: source.d, data: Float64Array.from(mappedPoints.data), weights: source.weights },
    target,
    elapsedMs: Date.now() - t0,
  };
}

/** Every k-th row of a sample so that at most PLOT_MAX_ROWS remain (a copy). O(n d). */
export function thin(s: Sample): PlotSample {
  const k = Math.max(1, Math.ceil(s.n / PLOT_MAX_ROWS));
  const n = Math.ceil(s.n / k);
  const data = new Float64Array(n * s.d);
  const weights = s.weights ? new Float64Array(n) : null;
  for (let i = 0, j = 0; i < s.n; i += k, j++) {
    for (let c = 0; c < s.d; c++) data[j * s.d + c] = s.data[i * s.d + c];
    if (weights && s.weights) weights[j] = s.weights[i];
  }
  return { n, d: s.d, data, weights };
}
