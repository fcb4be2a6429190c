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
export { weightedMean, weightedVariance, weightedQuantiles } from './statistics/weighted';
export { cellDeclusterWeights } from './declustering/cell-decluster-weights';
export type { CellSize } from './declustering/cell-decluster-weights';
export { declusterCellScan } from './declustering/decluster-cell-scan';
export type { DeclusterScanRow } from './declustering/decluster-cell-scan';
export { experimentalVariogram } from './variogram/experimental';
export { fitVariogram, variogramMisfit } from './variogram/fit';
// --- end of part 1 ---

// --- Part 2: kriging, simulation, recipe, validation, search, linalg (issue 4) — appended below this line ---
export { choleskyFactor, choleskySolve } from './linalg/cholesky';
export { krige } from './kriging/krige';
export type { KrigingResult, KrigingOptions } from './kriging/krige';
export { searchEllipsoid, normalisedCoordinates } from './search/search-ellipsoid';
export type { SearchEllipsoid } from './search/search-ellipsoid';
export { BucketGrid } from './search/bucket-grid';
export { selectNearest } from './search/select-nearest';
export { offsetTemplate } from './search/offset-template';
export type { OffsetTemplate } from './search/offset-template';
export type { TargetPoints, DomainInput, SearchOptions, SimulationInput } from './simulation/types';
export { detectLattice } from './simulation/lattice';
export type { Lattice } from './simulation/lattice';
export { prepareSimulation, COINCIDENCE_TOLERANCE, DEFAULT_REUSE_BYTES } from './simulation/prepare-simulation';
export type { PreparedSimulation, PreparedDomain, PrepareOptions } from './simulation/prepare-simulation';
export { simulate, simulatePrepared, realizationStream } from './simulation/simulate';
export type { SimulationStats } from './simulation/simulate';
export { sha256 } from './recipe/sha256';
export { canonicalJson } from './recipe/canonical-json';
export { ENGINE_VERSION, isCurrentEngine } from './recipe/engine-version';
export {
	sampleSchema,
	structureSchema,
	variogramModelSchema,
	domainInputSchema,
	simulationInputSchema,
	gridTargetsSchema,
	pointTargetsSchema,
	targetDefinitionSchema,
	recipeSchema
} from './recipe/schema';
export type { Recipe, TargetDefinition } from './recipe/schema';
export { targetsFromDefinition } from './recipe/targets-from-definition';
export { createRecipe, recipeInput } from './recipe/create-recipe';
export { recipeHash } from './recipe/recipe-hash';
export { regenerate } from './recipe/regenerate';
export { dataReproduction } from './validation/data-reproduction';
export type { DataReproduction } from './validation/data-reproduction';
export { histogramReproduction } from './validation/histogram-reproduction';
export type { HistogramReproduction } from './validation/histogram-reproduction';
export { variogramReproduction } from './validation/variogram-reproduction';
export type { VariogramReproductionLag } from './validation/variogram-reproduction';
// Issue 16: covariances from a table, reuse of solved systems, the multiple-grid path.
export { tabulatedCovariance, TabulatedCovariance, COVARIANCE_TABLE_STEP, COVARIANCE_TABLE_END } from './variogram/covariance-table';
export { SolutionCache, signatureHash } from './simulation/solution-cache';
export { multigridStrides, multigridLevel, multigridPath } from './simulation/multigrid-path';
// --- end of part 2 ---
