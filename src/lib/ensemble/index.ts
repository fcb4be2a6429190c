// Ensembles of realizations: the maps the summary endpoint and the browser both compute (the same function,
// so the same bits), the checks of realizations against their data and model, and weak-zone continuity.
// Pure, no DOM, no Node APIs.
export { ENSEMBLE_STATS, ensembleMap } from './ensemble-map';
export type { EnsembleStat } from './ensemble-map';
export { ksDistance } from './ks-distance';
export { gridVariogram } from './grid-variogram';
export type { GridVariogramLag } from './grid-variogram';
export { checkRealizations } from './domain-checks';
export type { CheckLevel, CheckVerdict, CheckOptions, DataCheck, HistogramCheck, VariogramCheck, VariogramCheckDirection, DomainCheck } from './domain-checks';
export { checkUniform } from './uniform-checks';
export type { UniformCheck } from './uniform-checks';
export { labelWeakZones, weakZoneFigures, weakZones, largestExtentQuantiles } from './weak-zones';
export type { WeakZoneGrid, WeakZoneLabels, RealizationWeakZones, WeakZoneOptions, WeakZoneSummary } from './weak-zones';
