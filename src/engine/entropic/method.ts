import type { MethodSpec } from '../method';
import { EntropicMap } from './entropic-map';
import { fitEntropic } from './fit';
import { ENTROPIC_SETTINGS } from './settings';

/**
 * The entropic method: Sinkhorn (entropic optimal transport for the cost
 * |x - y|^2 / 2) and the entropic map of Pooladian & Niles-Weed (2021, arXiv
 * 2109.12004), a smooth monotone map for any number of columns that takes row
 * weights. Its cost is the debiased Sinkhorn divergence (times 2). At most
 * 5,000 rows of positive weight per sample.
 */
export const entropicMethod: MethodSpec = {
  name: 'entropic',
  summary: 'Smooth joint map from entropic optimal transport (Sinkhorn); any number of columns, row weights allowed, up to 5,000 rows per sample.',
  shape: 'joint',
  settings: ENTROPIC_SETTINGS,
  minRows: () => 2,
  weights: true,
  fit: (source, target, settings, ctx) => fitEntropic(source, target, settings, ctx),
  fromJSON: (json) => EntropicMap.fromJSON(json),
};
