/**
 * The rectilinear target kind (cell centres listed per axis): what it expands to, that it adds a kind without
 * moving any existing bit or hash, and that a non-uniform grid is simulated off the lattice (the lattice mode and
 * the multiple-grid path need a regular spacing) and reproduces bit for bit.
 */
import { describe, expect, it } from 'vitest';
import {
	canonicalJson,
	createRecipe,
	detectLattice,
	recipeHash,
	recipeInput,
	recipeSchema,
	regenerate,
	simulate,
	targetsFromDefinition,
	type SimulationInput,
	type TargetDefinition
} from '../../../src/lib/geostat/index';
import { expectSameBits } from '../../asserts';

const input: SimulationInput = {
	seed: 'rect-1',
	domains: [
		{
			samples: [
				{ x: 2.5, y: 0, z: -0.625, value: 3.5, sounding: 'C1' },
				{ x: 2.5, y: 0, z: -3, value: 5.25, sounding: 'C1' },
				{ x: 7.5, y: 0, z: -1.125, value: 4.0, sounding: 'C2' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 8, rangeMinor: Infinity, rangeVertical: 1.5 }] },
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 8, maxSimulated: 8 }
		}
	]
};

// Columns 1 m wide; cells 1 m tall from −5 to −2, then 0.25 m tall from −2 to 0 (common practice: fine cells in
// the critical unit). Centres ascending, as the engine lists z.
const zCentres = [-4.5, -3.5, -2.5, -1.875, -1.625, -1.375, -1.125, -0.875, -0.625, -0.375, -0.125];
const xCentres = Array.from({ length: 10 }, (_, i) => i + 0.5);
const rect: TargetDefinition = {
	kind: 'rectilinear',
	x: xCentres,
	y: [0],
	z: zCentres,
	domainRuns: [[0, 100], [-1, 10]]
};

describe('targetsFromDefinition(rectilinear)', () => {
	it('lists (x[i], y[j], z[k]) with x fastest, then y, then z, and the domains in that order', () => {
		const t = targetsFromDefinition(rect);
		expect(t.x.length).toBe(110);
		expect([t.x[0], t.z[0], t.x[9], t.z[9], t.x[10], t.z[10]]).toEqual([0.5, -4.5, 9.5, -4.5, 0.5, -3.5]);
		expect([t.x[109], t.z[109], t.domain[99], t.domain[100]]).toEqual([9.5, -0.125, 0, -1]);
	});

	it('a 3D rectilinear grid runs y between x and z', () => {
		const t = targetsFromDefinition({ kind: 'rectilinear', x: [0, 1], y: [10, 12, 15], z: [-1, 0], domainRuns: [[0, 12]] });
		expect(Array.from(t.y.subarray(0, 6))).toEqual([10, 10, 12, 12, 15, 15]);
		expect(Array.from(t.z.subarray(5, 7))).toEqual([-1, 0]);
	});

	it('equals the regular grid kind point for point when the lists are the grid’s own centres', () => {
		const grid: TargetDefinition = { kind: 'grid', origin: { x: 0.5, y: 0, z: -4.5 }, spacing: { x: 1, y: 1, z: 0.5 }, counts: { x: 10, y: 1, z: 6 }, domainRuns: [[0, 60]] };
		const g = targetsFromDefinition(grid);
		const r = targetsFromDefinition({ kind: 'rectilinear', x: Array.from(g.x.subarray(0, 10)), y: [0], z: Array.from({ length: 6 }, (_, k) => g.z[k * 10]), domainRuns: [[0, 60]] });
		expectSameBits(r.x, g.x);
		expectSameBits(r.z, g.z);
		// Same targets, same bits: the realization does not depend on how the targets were written down.
		const a = regenerate(createRecipe(input, grid), 3);
		const b = regenerate(createRecipe(input, { kind: 'rectilinear', x: Array.from(g.x.subarray(0, 10)), y: [0], z: Array.from({ length: 6 }, (_, k) => g.z[k * 10]), domainRuns: [[0, 60]] }), 3);
		expectSameBits(b, a);
	});
});

describe('recipeSchema(rectilinear)', () => {
	it('refuses centres that do not increase and runs that do not cover the grid', () => {
		const base = JSON.parse(JSON.stringify(createRecipe(input, rect)));
		expect(recipeSchema.safeParse(base).success).toBe(true);
		expect(recipeSchema.safeParse({ ...base, targets: { ...rect, z: [...zCentres].reverse() } }).success).toBe(false);
		expect(recipeSchema.safeParse({ ...base, targets: { ...rect, x: [0, 0, 1] } }).success).toBe(false);
		expect(recipeSchema.safeParse({ ...base, targets: { ...rect, domainRuns: [[0, 109]] } }).success).toBe(false);
		expect(recipeSchema.safeParse({ ...base, targets: { ...rect, domainRuns: [[1, 110]] } }).success).toBe(false);
		expect(recipeSchema.safeParse({ ...base, targets: { ...rect, y: [] } }).success).toBe(false);
	});

	it('a rectilinear recipe hashes by its centres: moving one centre changes the hash', () => {
		const a = createRecipe(input, rect);
		const b = createRecipe(input, { ...rect, z: zCentres.map((z, k) => (k === 3 ? z - 1e-9 : z)) });
		expect(recipeHash(a)).not.toBe(recipeHash(b));
		expect(canonicalJson(a)).toContain('"kind":"rectilinear"');
	});
});

describe('regenerate(rectilinear recipe)', () => {
	it('a non-uniform grid is not taken for a lattice, and reproduces bit for bit as the same points would', () => {
		const t = targetsFromDefinition(rect);
		expect(detectLattice(t)).toBeNull();
		const recipe = createRecipe(input, rect, { realizations: 4 });
		const points: TargetDefinition = { kind: 'points', x: Array.from(t.x), y: Array.from(t.y), z: Array.from(t.z), domain: Array.from(t.domain) };
		for (const r of [0, 3]) {
			const values = regenerate(recipe, r);
			expectSameBits(regenerate(recipe, r), values);
			expectSameBits(values, simulate(recipeInput(recipe), targetsFromDefinition(points), r));
			expect(Number.isNaN(values[105])).toBe(true);
			// The datum at (2.5, −0.625) sits on a cell centre: the realization honours it exactly.
			expect(values[2 + 10 * 8]).toBe(3.5);
		}
	});

	it('asks for the multiple-grid path on a non-uniform grid and gets the random path (no lattice to coarsen)', () => {
		const mg = createRecipe({ ...input, domains: [{ ...input.domains[0], search: { ...input.domains[0].search, path: 'multigrid' } }] }, rect);
		const plain = createRecipe(input, rect);
		expectSameBits(regenerate(mg, 2), regenerate(plain, 2));
	});
});
