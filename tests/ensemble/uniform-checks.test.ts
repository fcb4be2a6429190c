import { describe, it, expect } from 'vitest';
import { checkRealizations, checkUniform } from '../../src/lib/ensemble/index';
import { canonicalJson, createUniformRecipe, regenerate, type UniformRecipe } from '../../src/lib/geostat/index';

const samples = (values: number[]) => values.map((value, i) => ({ x: i, y: 0, z: -i, value }));
const recipe = createUniformRecipe(
	[33, 50, 67],
	[
		{ samples: samples([60, 95, 120, 80]), weights: [1, 2, 1, 1] },
		{ samples: samples([0.2, 0.3]), weights: [1, 1] }
	],
	{ kind: 'grid', origin: { x: 0, y: 0, z: 0 }, spacing: { x: 1, y: 1, z: 1 }, counts: { x: 4, y: 1, z: 2 }, domainRuns: [[0, 3], [1, 2], [-1, 3]] }
);
const made = [0, 1, 2].map((r) => regenerate(recipe, r));

describe('checkUniform(recipe, realizations)', () => {
	it('checkUniform passes the recipe’s own realizations: values recomputed from the data, every cell at its value', () => {
		const checks = checkUniform(recipe, made);
		expect(checks.map((c) => [c.domain, c.cells, c.offCells, c.verdict.level])).toEqual([
			[0, 3, 0, 'ok'],
			[1, 2, 0, 'ok']
		]);
		expect(checks[0].recomputed).toEqual(checks[0].values);
		expect(checks[0].verdict.message).toMatch(/P33, P50, P67 of the domain’s 4 data/);
	});

	it('checkUniform takes realizations by number (a map) and checks only those given', () => {
		expect(checkUniform(recipe, new Map([[2, made[2]]]))[1].verdict.level).toBe('ok');
		// Realization 2 given as number 0: its cells do not hold the P33 values.
		expect(checkUniform(recipe, new Map([[0, made[2]]]))[0].offCells).toBe(3);
	});

	it('checkUniform flags recorded values that are not the data’s percentiles, and changed cells', () => {
		const edited = JSON.parse(canonicalJson(recipe)) as UniformRecipe;
		edited.input.domains[0].values[0] += 1;
		expect(checkUniform(edited, [])[0].verdict).toMatchObject({ level: 'off', message: expect.stringMatching(/not the declustered percentiles/) });
		const changed = made.map((v) => Float64Array.from(v));
		changed[1][4] = 0.26;
		expect(checkUniform(recipe, changed)[1]).toMatchObject({ offCells: 1, verdict: { level: 'off' } });
		expect(() => checkUniform(recipe, [new Float64Array(3)])).toThrow(RangeError);
	});

	it('checkRealizations refuses a uniform recipe (data, histogram and variogram reproduction do not apply)', () => {
		expect(() => checkRealizations(recipe, made)).toThrow('checked by checkUniform');
	});
});
