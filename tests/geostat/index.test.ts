import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as geostat from '../../src/lib/geostat/index';

// The engine's runtime exports, pinned (STYLE.md rule 2). Adding or removing an export means editing this list.

// Part 1 (issue 3): distributions, normal scores, declustering, statistics, variography.
const PART_1 = [
	'TAIL_P',
	'backTransform',
	'cellDeclusterWeights',
	'compileVariogram',
	'covariance',
	'declusterCellScan',
	'experimentalVariogram',
	'fitVariogram',
	'gamma',
	'inverseNormalCdf',
	'normalCdf',
	'normalScore',
	'planRotation',
	'reducedDistance',
	'totalSill',
	'unitGamma',
	'validateVariogramModel',
	'variogramMisfit',
	'weightedMean',
	'weightedQuantiles',
	'weightedVariance'
];

// --- Part 2 (issue 4): kriging, simulation, recipe, validation, search, linalg — maintained with that section of index.ts ---
const PART_2 = [
	'BucketGrid',
	'COINCIDENCE_TOLERANCE',
	'COVARIANCE_TABLE_END',
	'COVARIANCE_TABLE_STEP',
	'DEFAULT_REUSE_BYTES',
	'ENGINE_VERSION',
	'SolutionCache',
	'TabulatedCovariance',
	'canonicalJson',
	'choleskyFactor',
	'choleskySolve',
	'createRecipe',
	'dataReproduction',
	'detectLattice',
	'domainInputSchema',
	'gridTargetsSchema',
	'histogramReproduction',
	'isCurrentEngine',
	'krige',
	'multigridLevel',
	'multigridPath',
	'multigridStrides',
	'normalisedCoordinates',
	'offsetTemplate',
	'pointTargetsSchema',
	'prepareSimulation',
	'realizationStream',
	'recipeHash',
	'recipeInput',
	'recipeSchema',
	'regenerate',
	'sampleSchema',
	'searchEllipsoid',
	'selectNearest',
	'sha256',
	'signatureHash',
	'simulate',
	'simulatePrepared',
	'simulationInputSchema',
	'structureSchema',
	'tabulatedCovariance',
	'targetDefinitionSchema',
	'targetsFromDefinition',
	'variogramModelSchema',
	'variogramReproduction'
];
// --- end of part 2 ---

describe('src/lib/geostat/index.ts', () => {
	it('index.ts exports exactly the pinned names, none undefined', () => {
		expect(Object.keys(geostat).sort()).toEqual([...PART_1, ...PART_2].sort());
		for (const [name, value] of Object.entries(geostat)) expect(value, name).toBeDefined();
	});

	it('index.ts names every export explicitly (no export *)', () => {
		const text = readFileSync(join(__dirname, '../../src/lib/geostat/index.ts'), 'utf8');
		expect(text).not.toMatch(/^\s*export\s*\*/m);
	});

	it('part 1 exports are functions, except the tail constant', () => {
		for (const name of PART_1) {
			const v = (geostat as Record<string, unknown>)[name];
			if (name === 'TAIL_P') expect(v).toBe(1e-6);
			else expect(typeof v, name).toBe('function');
		}
	});
});
