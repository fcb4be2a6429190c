// The engine's public API. Every export is named here (no `export *`); tests/geostat/index.test.ts pins the list.

// --- Part 1: types, distributions, normal scores, declustering, statistics, variography (issue 3) ---
export type {
	Sample,
	StructureType,
	Structure,
	VariogramModel,
	LagBin,
	ExperimentalOptions,
	NormalScoreTable,
	FitOptions,
	FitInput
} from './types';
export {
	gamma,
	covariance,
	compileVariogram,
	planRotation,
	reducedDistance,
	unitGamma,
	totalSill,
	validateVariogramModel
} from './variogram/model';
export type { PlanRotation, CompiledVariogram } from './variogram/model';
export { inverseNormalCdf, normalCdf } from './distribution/normal';
export { normalScore, backTransform, TAIL_P } from './distribution/normal-score';
export type { NormalScoreOptions } from './distribution/normal-score';
// --- end of part 1 ---

// --- Part 2: kriging, simulation, recipe, validation, search, linalg (issue 4) — appended below this line ---
