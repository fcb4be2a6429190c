import { describe, it, expect } from 'vitest';
import { median } from 'simple-statistics';
import {
	canonicalJson,
	createUniformRecipe,
	ENGINE_VERSION,
	prepareRecipe,
	prepareUniform,
	recipeHash,
	recipeSchema,
	regenerate,
	uniformValues,
	type TargetDefinition,
	type UniformRecipe
} from '../../../src/lib/geostat/index';
import { domainStatistics } from '../../../src/lib/site/index';
import { expectAbsClose } from '../../asserts';

const samples = (values: number[]) => values.map((value, i) => ({ x: i, y: 0, z: -i, value, sounding: `C${i % 2}` }));
const grid: TargetDefinition = {
	kind: 'grid',
	origin: { x: 0.5, y: 0, z: -2.5 },
	spacing: { x: 1, y: 1, z: 1 },
	counts: { x: 3, y: 1, z: 3 },
	domainRuns: [[1, 3], [0, 4], [-1, 2]]
};
const sand = { samples: samples([60, 95, 120, 80, 140]), weights: [0.1, 0.3, 0.2, 0.25, 0.15] };
const clay = { samples: samples([0.22, 0.3, 0.27]), weights: [1, 1, 1] };

describe('uniformValues(values, weights, percentiles)', () => {
	it('uniformValues with equal weights puts P50 at the median (simple-statistics) and P25 at the definition-5 position', () => {
		const values = [12, 7, 3.5, 19, 8, 8, 1, 15.25, 4, 10];
		const [p50] = uniformValues(values, new Array(10).fill(1), [50]);
		expectAbsClose(p50, median(values), 1e-12, 'P50');
		// Positions (i − ½)/10 over the sorted values 1, 3.5, 4, 7, 8, 8, 10 …: the tied 8s share one step (0.4 … 0.6,
		// midpoint 0.5); 4 sits at 0.25, so P25 is 4 exactly.
		expect(uniformValues(values, new Array(10).fill(1), [25])[0]).toBe(4);
	});

	it('uniformValues with declustering weights interpolates between the weighted plotting positions (hand computed)', () => {
		// Sorted 60 (w .1), 80 (.25), 95 (.3), 120 (.2), 140 (.15): positions .05, .225, .5, .75, .925.
		const [p33, p50, p67, p99] = uniformValues(
			sand.samples.map((s) => s.value),
			sand.weights,
			[33, 50, 67, 99]
		);
		expectAbsClose(p33, 80 + (15 * (0.33 - 0.225)) / 0.275, 1e-12, 'P33');
		expect(p50).toBe(95);
		expectAbsClose(p67, 95 + (25 * (0.67 - 0.5)) / 0.25, 1e-12, 'P67');
		expect(p99).toBe(140);
	});

	it('uniformValues gives exactly the P10, P50 and P90 the domain statistics show (domainStatistics)', () => {
		const values = sand.samples.map((s) => s.value);
		const stats = domainStatistics(values, sand.weights);
		expect(uniformValues(values, sand.weights, [10, 50, 90])).toEqual([stats.p10, stats.p50, stats.p90]);
	});

	it('uniformValues refuses no data, a percentile of 0, 100 or NaN, and bad weights', () => {
		expect(() => uniformValues([], [], [50])).toThrow('a uniform domain needs data');
		for (const p of [0, 100, NaN, -5]) expect(() => uniformValues([1, 2], [1, 1], [p])).toThrow(RangeError);
		expect(() => uniformValues([1, 2], [1], [50])).toThrow(RangeError);
	});
});

describe('createUniformRecipe / prepareUniform / regenerate', () => {
	const recipe = createUniformRecipe([33, 50, 67], [sand, clay], grid);

	it('createUniformRecipe records kind, N = the number of percentiles, the data, weights and resolved values, and passes recipeSchema', () => {
		expect(recipe.kind).toBe('uniform');
		expect(recipe.realizations).toBe(3);
		expect(recipe.engineVersion).toBe(ENGINE_VERSION);
		expect(recipe.input.percentiles).toEqual([33, 50, 67]);
		expect(recipe.input.domains[0].values).toEqual(uniformValues(sand.samples.map((s) => s.value), sand.weights, [33, 50, 67]));
		expect(recipe.input.domains[1].weights).toEqual([1, 1, 1]);
		expect(recipeSchema.safeParse(JSON.parse(canonicalJson(recipe))).success).toBe(true);
	});

	it('a sensitivity list gives one realization per percentile: realization r holds each domain’s value at percentile r, NaN outside the domains', () => {
		const prepared = prepareRecipe(recipe);
		expect(prepared.kind).toBe('uniform');
		expect(prepared.realizations).toBe(3);
		expect(prepared.active).toBe(7);
		for (let r = 0; r < 3; r++) {
			const field = prepared.realize(r);
			const [s, c] = [recipe.input.domains[0].values[r], recipe.input.domains[1].values[r]];
			expect(Array.from(field)).toEqual([c, c, c, s, s, s, s, NaN, NaN]);
		}
		expect(() => prepared.realize(3)).toThrow("beyond the recipe's 3 realizations");
	});

	it('regenerate(uniform recipe, r) is the same bits after a round trip through canonical JSON, and reports progress once', () => {
		const again = recipeSchema.parse(JSON.parse(canonicalJson(recipe))) as UniformRecipe;
		expect(recipeHash(again)).toBe(recipeHash(recipe));
		const calls: [number, number][] = [];
		expect(regenerate(again, 1, (d, t) => calls.push([d, t]))).toEqual(regenerate(recipe, 1));
		expect(calls).toEqual([[7, 7]]);
	});

	it('prepareUniform refuses a recipe whose recorded values are not its data’s percentiles (edited by hand)', () => {
		const edited = JSON.parse(canonicalJson(recipe)) as UniformRecipe;
		edited.input.domains[1].values[1] = 0.25;
		expect(() => prepareUniform(edited)).toThrow('uniform values of domain 1 do not match its data');
		expect(() => regenerate(edited, 0)).toThrow('do not match');
	});

	it('recipeSchema refuses a uniform recipe with N not the number of percentiles, a value missing, or a domain without data', () => {
		const doc = JSON.parse(canonicalJson(recipe));
		expect(recipeSchema.safeParse({ ...doc, realizations: 2 }).success).toBe(false);
		const short = JSON.parse(canonicalJson(recipe));
		short.input.domains[0].values.pop();
		expect(recipeSchema.safeParse(short).success).toBe(false);
		const empty = JSON.parse(canonicalJson(recipe));
		empty.input.domains[0] = { samples: [], weights: [], values: [1, 2, 3] };
		expect(recipeSchema.safeParse(empty).success).toBe(false);
		expect(() => createUniformRecipe([50, 100], [sand], grid)).toThrow(RangeError);
	});

	it('createUniformRecipe does not mutate its inputs', () => {
		const before = JSON.stringify(sand);
		const ps = [50, 33];
		createUniformRecipe(ps, [sand, clay], grid);
		expect(JSON.stringify(sand)).toBe(before);
		expect(ps).toEqual([50, 33]);
	});
});
