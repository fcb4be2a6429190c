// The engine's public API, grouped by topic. Every export is named here (no `export *`);
// tests/geostat/index.test.ts pins the list topic by topic.

// --- Shared shapes ---
export type { Sample, StructureType, Structure, VariogramModel, LagBin, ExperimentalOptions, NormalScoreTable, FitOptions, FitInput } from './types';

// --- Normal distribution and normal scores ---
export { inverseNormalCdf, normalCdf } from './distribution/normal';
export { normalScore, backTransform, TAIL_P } from './distribution/normal-score';
export type { NormalScoreOptions } from './distribution/normal-score';

// --- Weighted statistics ---
export { weightedMean, weightedVariance, weightedQuantiles, weightedPlottingPositions } from './statistics/weighted';

// --- Declustering ---
export { cellDeclusterWeights } from './declustering/cell-decluster-weights';
export type { CellSize } from './declustering/cell-decluster-weights';
export { declusterCellScan } from './declustering/decluster-cell-scan';
export type { DeclusterScanRow } from './declustering/decluster-cell-scan';

// --- Variograms: models, experimental variograms, fitting ---
export { gamma, covariance, compileVariogram, planRotation, reducedDistance, unitGamma, totalSill, validateVariogramModel } from './variogram/model';
export type { PlanRotation, CompiledVariogram } from './variogram/model';
export { experimentalVariogram } from './variogram/experimental';
export { experimentalVariogramMap } from './variogram/map';
export type { VariogramMap, VariogramMapOptions } from './variogram/map';
export { fitVariogram, variogramMisfit } from './variogram/fit';

// --- Trend of the mean ---
export { fitLinearTrend } from './trend/fit-linear-trend';
export type { LinearTrendFit, TrendTerms } from './trend/fit-linear-trend';
export { trendValue, trendResiduals, validateTrend } from './simulation/trend';
export type { LinearTrend } from './simulation/trend';

// --- Linear algebra and kriging ---
export { choleskyFactor, choleskySolve } from './linalg/cholesky';
export { krige } from './kriging/krige';
export type { KrigingResult, KrigingOptions } from './kriging/krige';

// --- Neighbour search ---
export { searchEllipsoid, normalisedCoordinates } from './search/search-ellipsoid';
export type { SearchEllipsoid } from './search/search-ellipsoid';
export { BucketGrid } from './search/bucket-grid';
export { ActiveBuckets } from './search/active-buckets';
export { selectNearest } from './search/select-nearest';
export { offsetTemplate } from './search/offset-template';
export type { OffsetTemplate } from './search/offset-template';

// --- Sequential Gaussian simulation ---
export type { TargetPoints, DomainInput, SearchOptions, SimulationInput, PathOrder } from './simulation/types';
export { PATH_ORDERS } from './simulation/types';
export { detectLattice } from './simulation/lattice';
export type { Lattice } from './simulation/lattice';
export { prepareSimulation, COINCIDENCE_TOLERANCE, DEFAULT_REUSE_BYTES } from './simulation/prepare-simulation';
export type { PreparedSimulation, PreparedDomain, PrepareOptions } from './simulation/prepare-simulation';
export { simulate, simulatePrepared, realizationStream, pathStream } from './simulation/simulate';
export type { SimulationStats } from './simulation/simulate';
export { tabulatedCovariance, TabulatedCovariance, COVARIANCE_TABLE_STEP, COVARIANCE_TABLE_END } from './variogram/covariance-table';
export { SolutionCache, signatureHash } from './simulation/solution-cache';
export { multigridStrides, multigridLevel, multigridPath } from './simulation/multigrid-path';
export { PathPlan } from './simulation/path-plan';

// --- Recipes: schema, identity, engine version, regeneration ---
export {
	sampleSchema,
	structureSchema,
	variogramModelSchema,
	trendSchema,
	transformSchema,
	domainInputSchema,
	simulationInputSchema,
	gridTargetsSchema,
	pointTargetsSchema,
	rectilinearTargetsSchema,
	targetDefinitionSchema,
	recipeSchema,
	sgsRecipeSchema,
	uniformRecipeSchema,
	uniformDomainSchema,
	uniformInputSchema,
	recipeKindSchema
} from './recipe/schema';
export type { Recipe, SgsRecipe, UniformRecipe, UniformInput, RecipeKind, TargetDefinition } from './recipe/schema';
export { targetsFromDefinition } from './recipe/targets-from-definition';
export { createRecipe, recipeInput } from './recipe/create-recipe';
export type { EnsembleOptions } from './recipe/create-recipe';
export { canonicalJson } from './recipe/canonical-json';
export { sha256 } from './recipe/sha256';
export { recipeHash } from './recipe/recipe-hash';
export { ENGINE_VERSION, ENGINE_VERSIONS, isCurrentEngine, engineVersionOf } from './recipe/engine-version';
export { prepareRecipe } from './recipe/prepare-recipe';
export type { PreparedRecipe } from './recipe/prepare-recipe';
export { regenerate } from './recipe/regenerate';
export { withTypedPoints } from './recipe/typed-points';
export { parseRecipeDocument } from './recipe/parse-document';
export { uniformValues, createUniformRecipe, prepareUniform } from './recipe/uniform';
export type { UniformDomainData } from './recipe/uniform';

// --- Checking realizations against their data and model ---
export { dataReproduction } from './validation/data-reproduction';
export type { DataReproduction } from './validation/data-reproduction';
export { histogramReproduction } from './validation/histogram-reproduction';
export type { HistogramReproduction } from './validation/histogram-reproduction';
export { variogramReproduction } from './validation/variogram-reproduction';
export type { VariogramReproductionLag } from './validation/variogram-reproduction';
