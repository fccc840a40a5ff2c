import type { Progress } from '../../engine/map';
import { startFit } from '../../engine/methods';
import type { SampleFitRequest } from './messages';

/**
 * One worksheet cell's fit as the worker runs it: the engine's fit of the
 * samples, its diagnostics computed (the comparisons they need are kept in the
 * JSON, so the page never computes them), and the map's JSON.
 * Cost: that of the fit, plus its diagnostics.
 * @throws RemapError as the engine does.
 */
export async function runSampleFit(req: SampleFitRequest, onProgress: (p: Progress) => void): Promise<string> {
  const map = await startFit(req.method, req.source, req.target, req.settings, { onProgress, dropped: req.dropped, columns: req.columns });
  try {
    map.diagnostics();
    return JSON.stringify(map.toJSON());
  } finally {
    map.dispose();
  }
}
