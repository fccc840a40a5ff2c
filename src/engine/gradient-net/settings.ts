import { TAILS_SETTING, type SettingSpec } from '../settings';
import { UNITS_SETTING } from '../stats/column-scales';
import { MAX_HIDDEN, MAX_LAYERS } from './network-params';

/**
 * The gradient-net method's settings, `tails` (honoured: clamp or continue the
 * network, fitted-map.ts) and `units` included. Defaults chosen on the tuning
 * half of the bench zoo (bench/gradient-net-zoo.bench.ts).
 */
export const GRADIENT_NET_SETTINGS = [
  TAILS_SETTING,
  {
    name: 'hidden',
    type: 'integer',
    default: 0,
    min: 0,
    max: MAX_HIDDEN,
    describe: 'Hidden units of the network (1 to 1024); 0 = automatic, max(64, 12 x columns): 64 up to 5 columns, 96 at 8.',
  },
  {
    name: 'layers',
    type: 'integer',
    default: 1,
    min: 1,
    max: MAX_LAYERS,
    describe: 'Depth: 1 = closed-form input convex gradient network; 2 or more = cascaded monotone gradient network.',
  },
  {
    name: 'start',
    type: 'choice',
    default: 'entropic',
    choices: ['entropic', 'gaussian'],
    describe:
      'entropic (default): fit the network by regression to the entropic map of up to 4,000 rows per side, keeping the checkpoint closest to it ' +
      'on held-out rows; gaussian: start from the linear (Gaussian) map and train on the Sinkhorn divergence only.',
  },
  { name: 'steps', type: 'integer', default: 1500, min: 0, max: 1_000_000, describe: 'Most training steps in all (0 = keep the Gaussian warm start).' },
  { name: 'learning_rate', type: 'number', default: 0.01, min: 0, minExclusive: true, max: 1, describe: 'Adam step size.' },
  {
    name: 'batch',
    type: 'integer',
    default: 256,
    min: 0,
    max: 100_000,
    describe: 'Rows drawn from each sample per step (0 = all rows; the Sinkhorn part costs its square).',
  },
  {
    name: 'smoothing',
    type: 'number',
    default: 0,
    min: 0,
    max: 100,
    describe:
      'Entropic regularisation epsilon of the teacher map, in squared standardised units (the cost |x - y|^2 / 2, as in the entropic method); ' +
      '0 = automatic (0.125 x mean column variance x rows^(-2/(columns + 4))); the report shows the value used.',
  },
  { name: 'seed', type: 'integer', default: 0, min: 0, max: 4294967295, describe: 'Seed of the initial weights, the row subsamples and the batch order.' },
  {
    name: 'time_budget',
    type: 'number',
    default: 60,
    min: 0,
    minExclusive: true,
    max: 86400,
    describe: 'Seconds of fitting at most; the fit stops there with a warning.',
  },
  {
    name: 'backend',
    type: 'choice',
    default: 'wasm',
    choices: ['wasm', 'cpu'],
    describe: 'Tensor backend: wasm (fast, falls back to cpu if it cannot load) or cpu.',
  },
  UNITS_SETTING,
] as const satisfies readonly SettingSpec[];
