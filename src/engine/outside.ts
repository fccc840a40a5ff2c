import type { Mapped, MethodName, TransportMap, Warning } from './map';
import type { Settings } from './settings';

/**
 * What each method does with values outside the range it was fitted on, in
 * plain words. A method's spec may carry its own text (`MethodSpec.outside`);
 * these are the texts for every method the product ships, and the ones the
 * report, the warning and the README use. Methods that honour the `tails`
 * setting have one text per choice.
 */
export const OUTSIDE_FITTED_RANGE: Readonly<Record<MethodName, string | { readonly clamp: string; readonly linear: string }>> = Object.freeze({
  quantile: {
    clamp: 'values below or above the fitted source range are clamped: they map to the value the map gives at the nearest end of the range (tails=clamp)',
    linear: 'values below or above the fitted source range continue linearly along the slope of the first or last segment of the map (tails=linear)',
  },
  step: {
    clamp: 'values below or above the fitted source range are clamped: they map to the smallest or largest target value (tails=clamp)',
    linear: 'values below or above the fitted source range continue linearly along the slope at that end of the map (tails=linear)',
  },
  ordinal: {
    clamp: 'scores below or above the fitted source range are clamped: they map to the value the map gives at the nearest end of the range (tails=clamp)',
    linear: 'scores below or above the fitted source range continue linearly along the slope of the first or last segment of the map (tails=linear)',
  },
  linear:
    'the same affine map continues beyond the fitted range: nothing is clamped or capped, so a far-out value moves by the same rule as the values the map was fitted on, whether or not that rule still holds there',
  pairs: 'the map is defined on the fitted source rows only: a value that is not one of them is not mapped (no new points)',
  entropic:
    "every result is a weighted average of target rows, so it stays inside the target's convex hull: extreme values are pulled in towards the target's most extreme rows, which caps tail figures such as value at risk",
  'gradient-net': {
    clamp:
      'values outside the fitted source range are first clamped to that range column by column, so they map like the nearest point on its edge (tails=clamp)',
    linear: 'the fitted network is evaluated beyond the fitted source range as it stands, continuing its gradient smoothly (tails=linear)',
  },
});

/**
 * What happens outside the fitted range for `method` with these settings, in
 * words (the `tails` choice where the method honours it; clamp when absent).
 * O(1).
 * @example outsideText('linear', {}) // 'the same affine map continues beyond the fitted range: ...'
 */
export function outsideText(method: MethodName, settings: Settings, own?: string): string {
  if (own !== undefined) return own;
  const t = OUTSIDE_FITTED_RANGE[method];
  if (typeof t === 'string') return t;
  return settings.tails === 'linear' ? t.linear : t.clamp;
}

/**
 * The warning for one call of `apply` or `invert` whose rows lay partly outside
 * the range the map was fitted on, or null when none did. A map does not keep
 * counts across calls (its report must not depend on the order cells are
 * calculated in), so each caller words the warning for its own call.
 * O(1).
 * @param map the fitted map.
 * @param mapped what `map.apply` (or `invert`) returned for this call.
 * @param verb 'apply' (default) or 'invert': which fitted range the rows were compared with.
 * @example extrapolationWarning(map, map.apply(column([0, 99]))) // { code: 'extrapolation', message: '1 of 2 rows (50.0%) ...', action: '...' }
 */
export function extrapolationWarning(map: TransportMap, mapped: Pick<Mapped, 'n' | 'outside'>, verb: 'apply' | 'invert' = 'apply'): Warning | null {
  if (!(mapped.outside > 0)) return null;
  const side = verb === 'apply' ? 'source' : 'target';
  const share = mapped.outside / Math.max(1, mapped.n);
  const rule = verb === 'apply' ? outsideText(map.method, map.settings) : outsideText(map.method, map.settings).replace(/source range/g, 'target range');
  return {
    code: 'extrapolation',
    message: `${mapped.outside} of ${mapped.n} row${mapped.n === 1 ? '' : 's'} (${(100 * share).toFixed(1)}%) lay outside the ${side} range the ${map.method} map was fitted on; for them, ${rule}.`,
    action: 'Treat those results with caution, or fit on data that covers them.',
  };
}

/**
 * The product's text for `method` with both `tails` choices named where it
 * has them, for the pane, the README and `MethodSpec.outside`. O(1).
 * @example outsideBothTails('pairs') // 'the map is defined on the fitted source rows only: ...'
 */
export function outsideBothTails(method: MethodName): string {
  const t = OUTSIDE_FITTED_RANGE[method];
  if (typeof t === 'string') return t;
  return `with tails=clamp (default), ${t.clamp.replace(/ \(tails=clamp\)$/, '')}; with tails=linear, ${t.linear.replace(/ \(tails=linear\)$/, '')}`;
}
