/* The engine's whole public API: pure TypeScript numerics, no Office, no DOM. */

export { RemapError, isRemapError, type RemapErrorKind } from './errors';
export { points, column, sample, columnOf, toRows, type Points, type Sample } from './points';
export type {
  TransportMap,
  Mapped,
  CostReport,
  CostBound,
  LabelledCost,
  ComparisonRows,
  RowCounts,
  Diagnostics,
  Warning,
  WarningCode,
  Convergence,
  MapJSON,
  FitRecord,
  FitContext,
  Progress,
  MethodName,
} from './map';
export type { MethodSpec } from './method';
export { BaseMap, sizeWarnings, smallSampleWarning, smallSampleThreshold, ESTIMATE_REMINDER, type MapHeader } from './base';
export { extrapolationWarning, outsideText, outsideBothTails, OUTSIDE_FITTED_RANGE } from './outside';
export { labelCost } from './cost-label';
export { fitMap, fitMapSync, startFit, restoreMap, getMethod, listMethods, settingSpecs, outsideSummary, prepareFit } from './methods';
export { resolveSettings, parseSettingsText, COMMON_SETTINGS, TAILS_SETTING, type SettingSpec, type SettingValue, type Settings } from './settings';
export { chooseMethod, type MethodChoice } from './auto';
export { compareFit, compareOn, comparisonRows, COMPARISON_MAX_ROWS, COMPARISON_SEED, type Comparisons } from './assess';
export { parseMapJSON, checkMapJSON, MAX_MAP_JSON_CHARS } from './map-json';
export { Fingerprint } from './fingerprint';
export { Random } from './stats/random';

export { quantileMethod } from './quantile/quantile-method';
export { stepMethod } from './quantile/step-method';
export { ordinalMethod } from './quantile/ordinal-method';
export { wasserstein1d, transportCost1d, transportCosts1d } from './stats/wasserstein-1d';
export { weightedCdf, weightedCdfSorted, cdfShare, stepQuantile, type WeightedCdf } from './stats/weighted-cdf';
export { isSortedAscending, sortedCopy, sortOrder, sortWithOrder, sortWithWeights } from './stats/sort';

export { linearMethod } from './linear/method';
export { fitLinear, type LinearFitOptions } from './linear/fit';
export { LinearMap, type LinearParams } from './linear/linear-map';
export { gaussianW2Squared, type MatrixInput } from './linear/bures';
export { weightedMoments, type Moments } from './stats/moments';
export { kishEffectiveSize } from './stats/effective-size';
export { UNITS_SETTING, pooledColumnScales, type ColumnUnits } from './stats/column-scales';
export { symmetricEigen, spectralFunction, type SymmetricEigen } from './stats/symmetric-eigen';
export { psdSqrt, psdInverseSqrt } from './stats/sqrtm';
export { energyDistance, type EnergyResult, type EnergyOptions } from './stats/energy-distance';
export { ksStatistic } from './stats/ks';

export { pairsMethod, fitPairs } from './pairs/method';
export { solveAssignment, type Assignment, type AssignmentOptions } from './pairs/assignment';
export { findPairs, matchRows, MAX_PAIRS_ROWS, type RowMatch } from './pairs/match-rows';
export { PairsMap, type PairsParams } from './pairs/pairs-map';

export { entropicMethod } from './entropic/method';
export { fitEntropic } from './entropic/fit';
export { EntropicMap, type EntropicParts, type EntropicParamsJSON } from './entropic/entropic-map';
export { ENTROPIC_SETTINGS } from './entropic/settings';
export { solveSinkhorn, type TransportProblem, type SinkhornOptions, type SinkhornResult } from './entropic/sinkhorn';
export { sinkhornDivergence } from './entropic/sinkhorn-divergence';
export { barycentricMap } from './entropic/barycentric-map';
export { rowSquaredNorms, squaredDistances, squaredDistancesRow } from './stats/sq-distances';

export { gradientNetMethod, fitGradientNet } from './gradient-net/method';
export { GradientNetMap, type Frame } from './gradient-net/fitted-map';
export { configureBackend, type BackendOptions, type BackendName } from './gradient-net/backend';
export { GRADIENT_NET_SETTINGS } from './gradient-net/settings';
export type { NetworkParams } from './gradient-net/network-params';

export { fitGroupedMap, fitGroupedMapSync, type GroupedFitOptions } from './groups/fit-grouped';
export {
  GroupedMap,
  type GroupEntry,
  type GroupReport,
  type GroupedReport,
  type GroupedMapJSON,
  type GroupFallback,
  type GroupSizes,
} from './groups/grouped-map';
export { parseGroupedMapJSON, checkGroupedMapJSON, restoreGroupedMap, isGroupedMapJSON } from './groups/grouped-json';
export { groupKey, groupRows, type GroupLabel, type GroupRows } from './groups/group-labels';
export { kishRows } from './groups/effective-rows';
export { fitFromTables, COARSE_POINTS, COARSE_STEP, type Distribution1d, type TableBeyond } from './tables/fit-from-tables';
export { quantileTable, type QuantileTable } from './tables/quantile-table';
export { frequencyTable, frequencySample, frequencyTotal, type FrequencyTable } from './tables/frequency-table';
export { tableInterpolationError, type InterpolationError } from './tables/interpolation-error';
export { bootstrapBounds, type BootstrapOptions } from './uncertainty/bootstrap-bounds';
export { replicateBounds, type ReplicateOptions, type ReplicateWeights } from './uncertainty/replicate-bounds';
export { replicateMultiplier, replicateVariance, type ReplicateKind, type ReplicateScheme } from './uncertainty/replicate-variance';
export type { MappedBounds } from './uncertainty/mapped-bounds';
export { normalCdf, normalQuantile } from './uncertainty/normal-quantile';
