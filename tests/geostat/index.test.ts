import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as geostat from '../../src/lib/geostat/index';

// The engine's runtime exports, pinned (STYLE.md rule 2) topic by topic as index.ts groups them.
// Adding or removing an export means editing this list.
const TOPICS: Record<string, string[]> = {
	'normal distribution and normal scores': ['inverseNormalCdf', 'normalCdf', 'normalScore', 'backTransform', 'TAIL_P'],
	'weighted statistics': ['weightedMean', 'weightedVariance', 'weightedQuantiles', 'weightedPlottingPositions'],
	declustering: ['cellDeclusterWeights', 'declusterCellScan'],
	variograms: [
		'gamma',
		'covariance',
		'compileVariogram',
		'planRotation',
		'reducedDistance',
		'unitGamma',
		'totalSill',
		'validateVariogramModel',
		'experimentalVariogram',
		'experimentalVariogramMap',
		'fitVariogram',
		'variogramMisfit'
	],
	'trend of the mean': ['fitLinearTrend', 'trendValue', 'trendResiduals', 'validateTrend'],
	'linear algebra and kriging': ['choleskyFactor', 'choleskySolve', 'krige'],
	'neighbour search': ['searchEllipsoid', 'normalisedCoordinates', 'BucketGrid', 'ActiveBuckets', 'selectNearest', 'offsetTemplate'],
	simulation: [
		'detectLattice',
		'prepareSimulation',
		'COINCIDENCE_TOLERANCE',
		'DEFAULT_REUSE_BYTES',
		'simulate',
		'simulatePrepared',
		'realizationStream',
		'pathStream',
		'PATH_ORDERS',
		'PathPlan',
		'tabulatedCovariance',
		'TabulatedCovariance',
		'COVARIANCE_TABLE_STEP',
		'COVARIANCE_TABLE_END',
		'SolutionCache',
		'signatureHash',
		'multigridStrides',
		'multigridLevel',
		'multigridPath'
	],
	recipes: [
		'sampleSchema',
		'structureSchema',
		'variogramModelSchema',
		'trendSchema',
		'transformSchema',
		'domainInputSchema',
		'simulationInputSchema',
		'gridTargetsSchema',
		'pointTargetsSchema',
		'rectilinearTargetsSchema',
		'targetDefinitionSchema',
		'recipeSchema',
		'sgsRecipeSchema',
		'uniformRecipeSchema',
		'uniformDomainSchema',
		'uniformInputSchema',
		'recipeKindSchema',
		'targetsFromDefinition',
		'createRecipe',
		'recipeInput',
		'canonicalJson',
		'sha256',
		'recipeHash',
		'ENGINE_VERSION',
		'ENGINE_VERSIONS',
		'isCurrentEngine',
		'engineVersionOf',
		'prepareRecipe',
		'regenerate',
		'withTypedPoints',
		'parseRecipeDocument',
		'uniformValues',
		'createUniformRecipe',
		'prepareUniform'
	],
	validation: ['dataReproduction', 'histogramReproduction', 'variogramReproduction']
};
const ALL = Object.values(TOPICS).flat();

describe('src/lib/geostat/index.ts', () => {
	it('index.ts exports exactly the pinned names, none undefined', () => {
		expect(Object.keys(geostat).sort()).toEqual([...ALL].sort());
		expect(new Set(ALL).size).toBe(ALL.length);
		for (const [name, value] of Object.entries(geostat)) expect(value, name).toBeDefined();
	});

	it('index.ts names every export explicitly (no export *)', () => {
		const text = readFileSync(join(__dirname, '../../src/lib/geostat/index.ts'), 'utf8');
		expect(text).not.toMatch(/^\s*export\s*\*/m);
	});

	it('index.ts lists the topics in this order, each under its own heading', () => {
		const text = readFileSync(join(__dirname, '../../src/lib/geostat/index.ts'), 'utf8');
		const headings = [...text.matchAll(/^\/\/ --- (.+) ---$/gm)].map((m) => m[1]);
		expect(headings).toEqual([
			'Shared shapes',
			'Normal distribution and normal scores',
			'Weighted statistics',
			'Declustering',
			'Variograms: models, experimental variograms, fitting',
			'Trend of the mean',
			'Linear algebra and kriging',
			'Neighbour search',
			'Sequential Gaussian simulation',
			'Recipes: schema, identity, engine version, regeneration',
			'Checking realizations against their data and model'
		]);
	});

	it('the statistics, declustering and variogram exports are functions; TAIL_P is the tail probability', () => {
		for (const name of [...TOPICS['normal distribution and normal scores'], ...TOPICS['weighted statistics'], ...TOPICS.declustering, ...TOPICS.variograms]) {
			if (name === 'TAIL_P') continue;
			expect(typeof (geostat as Record<string, unknown>)[name], name).toBe('function');
		}
		expect(geostat.TAIL_P).toBe(1e-6);
	});
});
