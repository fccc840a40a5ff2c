/* The engine's whole public API: pure TypeScript numerics, no Office, no DOM. */

export { RemapError, isRemapError, type RemapErrorKind } from './errors';
export { points, column, sample, columnOf, toRows, type Points, type Sample } from './points';
export type { TransportMap, Mapped, CostReport, Diagnostics, Warning, WarningCode, Convergence, MapJSON, FitRecord, FitContext, Progress, MethodName } from './map';
export type { MethodSpec } from './method';
export { BaseMap, sizeWarnings, type MapHeader } from './base';
export { fitMap, fitMapSync, startFit, restoreMap, getMethod, listMethods, settingSpecs, prepareFit } from './methods';
export { resolveSettings, parseSettingsText, COMMON_SETTINGS, type SettingSpec, type SettingValue, type Settings } from './settings';
export { chooseMethod, type MethodChoice } from './auto';
export { compareFit, type Comparisons } from './assess';
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
