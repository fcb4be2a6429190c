// Ensembles of realizations: the maps the summary endpoint and the browser both compute (the same function,
// so the same bits), and the checks of realizations against their data and model. Pure, no DOM, no Node APIs.
export { ENSEMBLE_STATS, ensembleMap } from './ensemble-map';
export type { EnsembleStat } from './ensemble-map';
export { ksDistance } from './ks-distance';
export { gridVariogram } from './grid-variogram';
export type { GridVariogramLag } from './grid-variogram';
export { checkRealizations } from './domain-checks';
export type { CheckLevel, CheckVerdict, CheckOptions, DataCheck, HistogramCheck, VariogramCheck, VariogramCheckDirection, DomainCheck } from './domain-checks';
