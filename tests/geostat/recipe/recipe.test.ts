import { describe, it, expect } from 'vitest';
import {
	canonicalJson,
	createRecipe,
	recipeHash,
	recipeInput,
	recipeSchema,
	targetsFromDefinition,
	isCurrentEngine,
	prepareRecipe,
	engineVersionOf,
	regenerate,
	simulate,
	ENGINE_VERSION,
	ENGINE_VERSIONS
} from '../../../src/lib/geostat/index';
import type { SimulationInput, TargetDefinition } from '../../../src/lib/geostat/index';
import { expectSameBits } from '../../asserts';

const input: SimulationInput = {
	seed: 'levee-A',
	domains: [
		{
			samples: [
				{ x: 2, y: 0, z: -1, value: 3.5, sounding: 'C1' },
				{ x: 7, y: 0, z: -2, value: 5.25, sounding: 'C2' },
				{ x: 7, y: 0, z: -1, value: 4.0, sounding: 'C2' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 8, rangeMinor: Infinity, rangeVertical: 1.5 }] },
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 8, maxSimulated: 8 }
		}
	]
};
const grid: TargetDefinition = {
	kind: 'grid',
	origin: { x: 0, y: 0, z: -3 },
	spacing: { x: 1, y: 1, z: 0.5 },
	counts: { x: 10, y: 1, z: 6 },
	domainRuns: [[0, 50], [-1, 10]]
};

describe('canonicalJson(value)', () => {
	it('canonicalJson sorts keys at every depth, so key order never changes the text (RFC 8785 idea)', () => {
		expect(canonicalJson({ b: 1, a: { d: [1, { f: 2, e: 3 }], c: 'x' } })).toBe('{"a":{"c":"x","d":[1,{"e":3,"f":2}]},"b":1}');
		expect(canonicalJson({ a: 1, b: 2 })).toBe(canonicalJson({ b: 2, a: 1 }));
	});
	it('canonicalJson writes numbers in shortest round-trip form and drops undefined members', () => {
		expect(canonicalJson([0.1, 1e21, 1e-7, -0, 5, 1 / 3])).toBe('[0.1,1e+21,1e-7,0,5,0.3333333333333333]');
		expect(canonicalJson({ a: undefined, b: null })).toBe('{"b":null}');
		expect(canonicalJson(new Float64Array([1.5, 2]))).toBe('[1.5,2]');
	});
	it('canonicalJson rejects NaN, Infinity, functions and cycles', () => {
		expect(() => canonicalJson(NaN)).toThrow(RangeError);
		expect(() => canonicalJson([Infinity])).toThrow(RangeError);
		expect(() => canonicalJson(() => 1)).toThrow(TypeError);
		const cyc: Record<string, unknown> = {};
		cyc.self = cyc;
		expect(() => canonicalJson(cyc)).toThrow('cyclic structure');
	});
});

describe('createRecipe / recipeHash', () => {
	it('createRecipe stamps ENGINE_VERSION, writes infinite ranges as null and passes recipeSchema', () => {
		const r = createRecipe(input, grid);
		expect(r.engineVersion).toBe(ENGINE_VERSION);
		expect(r.input.domains[0].model.structures[0].rangeMinor).toBeNull();
		expect(recipeSchema.safeParse(JSON.parse(JSON.stringify(r))).success).toBe(true);
		expect(recipeInput(r).domains[0].model.structures[0].rangeMinor).toBe(Infinity);
		expect(isCurrentEngine(r)).toBe(true);
		expect(isCurrentEngine({ ...r, engineVersion: 'conefield-sgs/0' })).toBe(false);
		// Version 1 computed covariances exactly rather than from the table (issue 16); version 2 knew no trends.
		expect(ENGINE_VERSION).toBe('conefield-sgs/3');
		expect(isCurrentEngine({ ...r, engineVersion: 'conefield-sgs/1' })).toBe(false);
		expect(isCurrentEngine({ ...r, engineVersion: 'conefield-sgs/2' })).toBe(false);
	});

	it('recipeHash is 64 hex digits, unchanged by key order, changed by any value', () => {
		const r = createRecipe(input, grid);
		const h = recipeHash(r);
		expect(h).toMatch(/^[0-9a-f]{64}$/);
		const reordered = JSON.parse(canonicalJson(r), (_k, v) =>
			v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v
		);
		expect(Object.keys(reordered)[0]).not.toBe(Object.keys(r)[0]);
		expect(recipeHash(reordered)).toBe(h);
		expect(recipeHash(createRecipe({ ...input, seed: 'levee-B' }, grid))).not.toBe(h);
		expect(recipeHash({ ...r, engineVersion: 'conefield-sgs/0' })).not.toBe(h);
	});

	it('recipeSchema accepts a nugget with ranges 0 and rejects a non-nugget range of 0', () => {
		const nug = { type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 } as const;
		const withNugget = { ...input, domains: [{ ...input.domains[0], model: { azimuth: 0, structures: [nug, input.domains[0].model.structures[0]] } }] };
		expect(() => createRecipe(withNugget, grid)).not.toThrow();
		const bad = { ...input, domains: [{ ...input.domains[0], model: { azimuth: 0, structures: [{ ...nug, type: 'spherical' as const }] } }] };
		expect(() => createRecipe(bad, grid)).toThrow(/ranges must be > 0/);
	});

	it('createRecipe rejects invalid inputs with RangeError naming the issue', () => {
		expect(() => createRecipe(input, { ...grid, domainRuns: [[0, 5]] })).toThrow(/domain runs must cover the grid/);
		expect(() => createRecipe(input, { ...grid, domainRuns: [[1, 60]] })).toThrow(/target domain out of range/);
		const bad = { ...input, domains: [{ ...input.domains[0], samples: [] }] };
		expect(() => createRecipe(bad, grid)).toThrow(/normal-score domain needs samples/);
	});
});

describe('targetsFromDefinition(def)', () => {
	it('targetsFromDefinition(grid) lists origin + index·spacing, x fastest, with the domain runs', () => {
		const t = targetsFromDefinition(grid);
		expect(t.x.length).toBe(60);
		expect([t.x[0], t.z[0], t.x[9], t.x[10], t.z[10], t.z[59]]).toEqual([0, -3, 9, 0, -2.5, -0.5]);
		expect(t.domain[49]).toBe(0);
		expect(t.domain[50]).toBe(-1);
	});
	it('targetsFromDefinition(points) copies the columns and rejects unequal lengths', () => {
		const t = targetsFromDefinition({ kind: 'points', x: [1, 2], y: [0, 0], z: [3, 4], domain: [0, -1] });
		expect(Array.from(t.z)).toEqual([3, 4]);
		expect(() => targetsFromDefinition({ kind: 'points', x: [1], y: [], z: [1], domain: [0] })).toThrow(RangeError);
	});
});

describe('regenerate(recipe, r)', () => {
	it('regenerate(recipe, r) equals simulate of the recipe input bit for bit, also after a JSON round trip', () => {
		const r = createRecipe(input, grid);
		const direct = simulate(input, targetsFromDefinition(grid), 3);
		expectSameBits(regenerate(r, 3), direct);
		expectSameBits(regenerate(JSON.parse(JSON.stringify(r)), 3), direct);
	});
	it('regenerate refuses a recipe of another engine version', () => {
		const r = createRecipe(input, grid);
		expect(() => regenerate({ ...r, engineVersion: 'conefield-sgs/0' }, 0)).toThrow('recipe is from engine version conefield-sgs/0');
		expect(() => regenerate({ ...r, engineVersion: 'conefield-sgs/1' }, 0)).toThrow('recipe is from engine version conefield-sgs/1');
	});

	it('createRecipe keeps search.path, a recipe without it hashes as before, and regenerate follows it', () => {
		const plain = createRecipe(input, grid);
		expect(plain.input.domains[0].search.path).toBeUndefined();
		expect(canonicalJson(plain)).not.toContain('path');
		const mg = createRecipe({ ...input, domains: [{ ...input.domains[0], search: { ...input.domains[0].search, path: 'multigrid' } }] }, grid);
		expect(mg.input.domains[0].search.path).toBe('multigrid');
		expect(recipeHash(mg)).not.toBe(recipeHash(plain));
		expectSameBits(regenerate(mg, 1), simulate(recipeInput(mg), targetsFromDefinition(grid), 1));
		expect(Array.from(regenerate(mg, 1))).not.toEqual(Array.from(regenerate(plain, 1)));
		expect(recipeSchema.safeParse({ ...mg, input: { ...mg.input, domains: [{ ...mg.input.domains[0], search: { maxData: 1, maxSimulated: 1, path: 'spiral' } }] } }).success).toBe(false);
		// A constant path: kept, hashed, followed by regenerate (which keeps no plan) as by simulate.
		const constant = createRecipe({ ...input, domains: [{ ...input.domains[0], search: { ...input.domains[0].search, path: 'random-constant' } }] }, grid);
		expect(constant.input.domains[0].search.path).toBe('random-constant');
		expect(recipeHash(constant)).not.toBe(recipeHash(plain));
		expectSameBits(regenerate(constant, 1), simulate(recipeInput(constant), targetsFromDefinition(grid), 1));
		expect(Array.from(regenerate(constant, 1))).not.toEqual(Array.from(regenerate(plain, 1)));
	});
});

describe('ensemble recipes: kind and realizations', () => {
	// The recipe of this file as a stored document with a fixed engine version string, so the pin does not move
	// when ENGINE_VERSION does. Its hash was computed before `kind` and `realizations` existed.
	const stored = () => ({ ...JSON.parse(JSON.stringify(createRecipe(input, grid))), engineVersion: 'conefield-sgs/1' });
	it('recipeHash of a recipe without kind and realizations is unchanged by the two optional fields (pinned)', () => {
		const parsed = recipeSchema.parse(stored());
		expect(Object.keys(parsed).sort()).toEqual(['engineVersion', 'input', 'targets']);
		expect(recipeHash(parsed)).toBe('7b62add825be37fd618865e96f0a535c2b1650867e4a2fdbb72091c2b58fd27f');
	});

	it("createRecipe(input, targets, { realizations }) adds kind 'sgs' and N, and N is part of the hash", () => {
		const plain = createRecipe(input, grid);
		const twenty = createRecipe(input, grid, { realizations: 20 });
		expect(twenty.kind).toBe('sgs');
		expect(twenty.realizations).toBe(20);
		expect(canonicalJson(twenty)).toMatch(/^\{"engineVersion":"[^"]+","input":.*,"kind":"sgs","realizations":20,"targets":/);
		const h = recipeHash(twenty);
		expect(h).not.toBe(recipeHash(plain));
		expect(recipeHash(createRecipe(input, grid, { realizations: 21 }))).not.toBe(h);
		expect(recipeHash(createRecipe(input, grid, { realizations: 20 }))).toBe(h);
		expect(() => createRecipe(input, grid, { realizations: 0 })).toThrow(/realizations/);
		expect(recipeSchema.safeParse({ ...twenty, kind: 'uniform' }).success).toBe(false);
	});

	it('prepareRecipe dispatches on the kind (none means sgs) and realizes what regenerate does, bit for bit', () => {
		const r = createRecipe(input, grid, { realizations: 4 });
		const prepared = prepareRecipe(r);
		expect(prepared.kind).toBe('sgs');
		expect(prepared.active).toBe(50);
		expect(prepared.realizations).toBe(4);
		expectSameBits(prepared.realize(2), regenerate(r, 2));
		expectSameBits(prepareRecipe(createRecipe(input, grid)).realize(2), prepared.realize(2));
		expect(prepareRecipe(createRecipe(input, grid)).realizations).toBeNull();
	});

	it('a realization at or beyond N is refused; so are negative and fractional numbers', () => {
		const r = createRecipe(input, grid, { realizations: 4 });
		expect(() => regenerate(r, 4)).toThrow("realization 4 is beyond the recipe's 4 realizations");
		expect(() => prepareRecipe(r).realize(-1)).toThrow(RangeError);
		expect(() => prepareRecipe(r).realize(1.5)).toThrow(RangeError);
		expect(() => regenerate(createRecipe(input, grid), 400)).not.toThrow();
	});

	it('prepareRecipe refuses an invalid recipe naming the issue, and one of another engine version', () => {
		const r = createRecipe(input, grid, { realizations: 4 });
		expect(() => prepareRecipe({ ...r, realizations: -2 })).toThrow(/invalid recipe: realizations/);
		expect(() => prepareRecipe({ ...r, engineVersion: 'conefield-sgs/0' })).toThrow('recipe is from engine version conefield-sgs/0');
	});
});

describe('engine versions', () => {
	// A recipe as engine version 1 wrote it (before trends): the literal JSON of createRecipe then.
	const v1 = () => ({ ...JSON.parse(JSON.stringify(createRecipe(input, grid))), engineVersion: 'conefield-sgs/1' });

	it('ENGINE_VERSION is conefield-sgs/3 (trends), the newest of ENGINE_VERSIONS', () => {
		expect(ENGINE_VERSION).toBe('conefield-sgs/3');
		expect(ENGINE_VERSIONS.map((v) => v.version)).toEqual(['conefield-sgs/1', 'conefield-sgs/2', 'conefield-sgs/3']);
		expect(ENGINE_VERSIONS.at(-1)!.change).toMatch(/trend/);
	});

	it('a version-1 recipe still parses, keeps its hash, and is recognised as version 1, not current', () => {
		const old = v1();
		const before = recipeHash(old);
		const parsed = recipeSchema.parse(old);
		expect('trend' in parsed.input.domains[0]).toBe(false);
		expect(recipeHash(parsed)).toBe(before);
		expect(isCurrentEngine(parsed)).toBe(false);
		expect(engineVersionOf(parsed)).toEqual({ version: 'conefield-sgs/1', change: 'first engine', current: false });
		expect(engineVersionOf(createRecipe(input, grid))?.current).toBe(true);
		expect(engineVersionOf({ engineVersion: 'conefield-sgs/2' })).toMatchObject({ version: 'conefield-sgs/2', current: false });
		expect(engineVersionOf({ engineVersion: 'someone-else/7' })).toBeNull();
		expect(() => regenerate(parsed, 0)).toThrow('recipe is from engine version conefield-sgs/1');
	});
});
