import type { FitContext, MapJSON, MethodName, TransportMap } from './map';
import type { Sample } from './points';
import type { SettingSpec, Settings } from './settings';

/**
 * What a method folder exports so the rest of the product can use it: its
 * name, a one-line summary, its settings, the fewest rows it can fit from,
 * and how to fit and how to restore from JSON. Adding a method is writing one
 * of these and listing it in methods.ts (see DEVELOPERS.md).
 */
export interface MethodSpec {
  readonly name: MethodName;
  /** One line for the pane, the report and the README. */
  readonly summary: string;
  /** 'one-column' methods fit several columns each on its own (marginals only). */
  readonly shape: 'one-column' | 'joint';
  /** Every setting the method takes (include TAILS_SETTING when the method honours `tails`). */
  readonly settings: readonly SettingSpec[];
  /**
   * What the method does with values outside the fitted range, in words (both
   * `tails` choices where it honours them). When left out, `outsideSummary`
   * uses the product's text for the method (outside.ts).
   */
  readonly outside?: string;
  /** The fewest rows (with positive weight) each sample needs, given d. */
  minRows(d: number): number;
  /** True when `fit` trains in the background and returns a Promise. */
  readonly background?: boolean;
  /** Can this method use row weights? */
  readonly weights: boolean;
  /** Fits from validated samples (same d, finite, weights checked) and resolved settings. */
  fit(source: Sample, target: Sample, settings: Settings, ctx: FitContext): TransportMap | Promise<TransportMap>;
  /** Restores a fitted map from `toJSON()` output whose envelope is already validated. */
  fromJSON(json: MapJSON): TransportMap;
}
