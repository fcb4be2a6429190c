// The variography workspace's computations: what workers/variography.ts runs, callable directly in tests.
export type {
	DomainSamplesData,
	TrendChoice,
	LagSettings,
	VariogramSettings,
	FitRequest,
	SavedVariogramSettings,
	ExperimentalResult,
	ModelParameters,
	Misfit,
	ModelMisfit,
	RangeSensitivity,
	Plateau,
	PlateauCheck,
	Progress
} from './types';
export { prepareSamples } from './prepare-samples';
export { domainTrend } from './domain-trend';
export type { PreparedSamples } from './prepare-samples';
export { computeVariograms } from './compute-variograms';
export type { ComputeOptions } from './compute-variograms';
export { modelFromParameters, parametersFromModel } from './model-parameters';
export { modelMisfit, misfitOrNull } from './model-misfit';
export { modelCurves } from './model-curves';
export type { ModelCurves } from './model-curves';
export { autoFit } from './auto-fit';
export type { AutoFitOptions, AutoFitBins } from './auto-fit';
export { plateauCheck, PLATEAU_TOLERANCE } from './plateau-check';
export { mapAnisotropy } from './map-anisotropy';
export type { MapAnisotropy } from './map-anisotropy';
export { rangeSensitivity, ADMITTED_TOLERANCE } from './range-sensitivity';
export type { SensitivityOptions } from './range-sensitivity';
export { lagTableCsv } from './lag-table-csv';
export { defaultSettings } from './default-settings';
