import { describe, it, expect } from 'vitest';
import { canonicalJson, createRecipe, parseRecipeDocument, prepareRecipe, recipeHash, recipeSchema, withTypedPoints } from '../../../src/lib/geostat/index';
import type { Recipe, SimulationInput, TargetDefinition } from '../../../src/lib/geostat/index';
import { expectSameBits } from '../../asserts';

const input: SimulationInput = {
	seed: 'parse-doc',
	domains: [
		{
			samples: [
				{ x: 2.25, y: 0, z: -1.1, value: 3.5, sounding: 'C1' },
				{ x: 7.5, y: 0, z: -2.3, value: 5.25, sounding: 'C2' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 8, rangeMinor: Infinity, rangeVertical: 1.5 }] },
			transform: 'none',
			kriging: 'simple',
			mean: 4,
			search: { maxData: 4, maxSimulated: 4 }
		}
	]
};
// Off a lattice, with numbers canonical JSON writes in every form: exponents, −0 (written 0), long fractions.
const points: TargetDefinition = {
	kind: 'points',
	x: [0.1, 1e-7, 3.3333333333333335, 9.75, 1e21, -0, 6.02],
	y: [0, 0, 0, 0, 0, 0, 0],
	z: [-0.5, -1.25, -2.000001, -3, -0.1, -2.5, -1.7],
	domain: [0, 0, -1, 0, 0, -1, 0]
};
const recipe = createRecipe(input, points, { realizations: 3 });
const text = canonicalJson(recipe);

describe('parseRecipeDocument(text)', () => {
	it('gives the recipe JSON.parse gives, with typed columns, so its canonical JSON (and hash) is the stored text', () => {
		const parsed = parseRecipeDocument(text);
		const t = parsed.targets as { x: unknown; y: unknown; z: unknown; domain: unknown };
		expect(t.x).toBeInstanceOf(Float64Array);
		expect(t.domain).toBeInstanceOf(Int32Array);
		expect(canonicalJson(parsed)).toBe(text);
		expect(recipeHash(parsed)).toBe(recipeHash(recipe));
		const plain = JSON.parse(text) as Recipe & { targets: { x: number[]; y: number[]; z: number[]; domain: number[] } };
		expect({ ...parsed, targets: null }).toEqual({ ...plain, targets: null });
		for (const k of ['x', 'y', 'z', 'domain'] as const) expectSameBits(Float64Array.from((parsed.targets as unknown as Record<string, ArrayLike<number>>)[k]), Float64Array.from(plain.targets[k]));
	});

	it('a parsed document passes the recipe schema without a copy of its columns, and realizes the same bits', () => {
		const parsed = parseRecipeDocument(text);
		const checked = recipeSchema.parse(parsed);
		expect((checked.targets as { x: unknown }).x).toBe((parsed.targets as { x: unknown }).x);
		for (const r of [0, 2]) expectSameBits(prepareRecipe(parsed).realize(r), prepareRecipe(recipe).realize(r));
	});

	it('with shared, the columns live in SharedArrayBuffers (a worker reads them in place)', () => {
		const t = parseRecipeDocument(text, { shared: true }).targets as { x: Float64Array; domain: Int32Array };
		expect(t.x.buffer).toBeInstanceOf(SharedArrayBuffer);
		expect(t.domain.buffer).toBeInstanceOf(SharedArrayBuffer);
		expect(Array.from(t.domain)).toEqual(points.kind === 'points' ? points.domain : []);
	});

	it('parses grid recipes and text that is not canonical whole, with the same result as JSON.parse', () => {
		const grid: TargetDefinition = { kind: 'grid', origin: { x: 0, y: 0, z: -3 }, spacing: { x: 1, y: 1, z: 0.5 }, counts: { x: 4, y: 1, z: 2 }, domainRuns: [[0, 8]] };
		const g = canonicalJson(createRecipe(input, grid));
		expect(parseRecipeDocument(g)).toEqual(JSON.parse(g));
		const spaced = JSON.stringify(JSON.parse(text), null, 1);
		expect(canonicalJson(parseRecipeDocument(spaced))).toBe(text);
		const empty = canonicalJson(createRecipe(input, { kind: 'points', x: [], y: [], z: [], domain: [] }));
		expect((parseRecipeDocument(empty).targets as { x: Float64Array }).x).toHaveLength(0);
	});

	it('refuses a column entry that is not a number, and columns of unequal length', () => {
		expect(() => parseRecipeDocument(text.replace('"x":[0.1,', '"x":[0.1,,'))).toThrow(RangeError);
		expect(() => parseRecipeDocument(text.replace('"x":[0.1,', '"x":[0.1,abc,'))).toThrow(/not a number/);
		expect(() => parseRecipeDocument(text.replace('"x":[0.1,', '"x":['))).toThrow('point columns must have equal lengths');
		expect(() => parseRecipeDocument('{"engineVersion":')).toThrow(SyntaxError);
	});
});

describe('withTypedPoints(recipe)', () => {
	it('keeps the canonical JSON and the realizations; leaves other recipes and its input alone', () => {
		const typed = withTypedPoints(recipe);
		expect(canonicalJson(typed)).toBe(text);
		expect(Array.isArray((recipe.targets as { x: unknown }).x)).toBe(true);
		expectSameBits(prepareRecipe(typed).realize(1), prepareRecipe(recipe).realize(1));
		const grid = createRecipe(input, { kind: 'grid', origin: { x: 0, y: 0, z: 0 }, spacing: { x: 1, y: 1, z: 1 }, counts: { x: 2, y: 1, z: 1 }, domainRuns: [[0, 2]] });
		expect(withTypedPoints(grid)).toBe(grid);
	});
});

describe('pointTargetsSchema (through recipeSchema)', () => {
	it('refuses non-finite coordinates and domains that are not integers >= -1, typed or not', () => {
		const bad = (targets: object) => recipeSchema.safeParse({ ...recipe, targets: { ...recipe.targets, ...targets } }).success;
		expect(bad({})).toBe(true);
		expect(bad({ x: [NaN, 0, 0, 0, 0, 0, 0] })).toBe(false);
		expect(bad({ z: Float64Array.of(Infinity, 0, 0, 0, 0, 0, 0) })).toBe(false);
		expect(bad({ x: ['1', 0, 0, 0, 0, 0, 0] })).toBe(false);
		expect(bad({ domain: [0, 0, -2, 0, 0, 0, 0] })).toBe(false);
		expect(bad({ domain: [0, 0, 0.5, 0, 0, 0, 0] })).toBe(false);
		expect(bad({ domain: [0, 0, 1, 0, 0, 0, 0] })).toBe(false);
		expect(bad({ domain: Float64Array.of(0, 0, 0, 0, 0, 0, 0) })).toBe(false);
		expect(bad({ domain: Int32Array.of(0, 0, -1, 0, 0, -1, 0) })).toBe(true);
	});
});
