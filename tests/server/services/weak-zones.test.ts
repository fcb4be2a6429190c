import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { users } from '../../../src/lib/server/db/schema';
import { recipeWeakZones } from '../../../src/lib/server/db/recipe-schema';
import { InvalidInput } from '../../../src/lib/server/errors';
import { seedDemo } from '../../../src/lib/server/services/demo';
import { createRecipe, deleteRecipe, loadRecipe } from '../../../src/lib/server/services/recipes';
import { listZoneBoundaries } from '../../../src/lib/server/services/stratigraphy';
import { recipeWeakZonesOf } from '../../../src/lib/server/services/weak-zones';
import { listZonations } from '../../../src/lib/server/services/zonations';
import { stopRealizations } from '../../../src/lib/server/realizations';
import { regenerate, type Recipe } from '../../../src/lib/geostat/index';
import { boundarySides } from '../../../src/lib/site/index';
import { expandRuns } from '../../../src/lib/plots/raster';
import { expectAbsClose, expectSameBits } from '../../asserts';
import { recipeSetupSchema } from '../../../src/lib/schemas/recipe';

let db: Db;
let projectId: string;
let recipeId: string;
let recipe: Recipe & { targets: { kind: 'grid' } };
let boundaryId: string;
let hash: string;

const coarse = { geometry: '2d', chainage: { from: 0, to: 400, cell: 5 }, elevation: { from: -12, to: 5, cell: 0.5 } } as const;

/** Breadth-first labelling written here, independent of the module's (4-neighbour in the section). */
function bfsZones(values: Float64Array, eligible: Uint8Array, nx: number, nz: number, threshold: number) {
	const label = new Int32Array(values.length).fill(-1);
	const zones: { cells: number[] }[] = [];
	for (let s = 0; s < values.length; s++) {
		if (label[s] >= 0 || !eligible[s] || !(values[s] < threshold)) continue;
		const queue = [s];
		label[s] = zones.length;
		const cells: number[] = [];
		while (queue.length) {
			const c = queue.shift()!;
			cells.push(c);
			const i = c % nx;
			const k = Math.floor(c / nx);
			for (const [di, dk] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) {
				const ii = i + di;
				const kk = k + dk;
				if (ii < 0 || ii >= nx || kk < 0 || kk >= nz) continue;
				const d = ii + nx * kk;
				if (label[d] < 0 && eligible[d] && values[d] < threshold) {
					label[d] = zones.length;
					queue.push(d);
				}
			}
		}
		zones.push({ cells });
	}
	return { label, zones };
}

beforeAll(async () => {
	db = openDatabase(':memory:');
	projectId = (await seedDemo(db))!;
	const userId = db.select({ id: users.id }).from(users).where(eq(users.email, 'analyst@conefield.test')).get()!.id;
	const grouped = listZonations(projectId, db).find((z) => z.name === 'Sand grouped')!;
	recipeId = createRecipe(
		projectId,
		userId,
		recipeSetupSchema.parse({ name: 'Weak', zonationId: grouped.id, seed: 'weak-1', realizations: 4, grid: coarse, domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true })) }),
		db
	).recipe.id;
	const loaded = loadRecipe(projectId, recipeId, db);
	hash = loaded.hash;
	recipe = loaded.recipe as typeof recipe;
	boundaryId = listZoneBoundaries(projectId, db)[0].id;
}, 120_000);
afterAll(() => stopRealizations());

describe('recipeWeakZonesOf(projectId, recipeId, query)', () => {
	it('per realization, the figures of a breadth-first labelling of regenerate(recipe, r) written here; the map counts zones ≥ minLength', async () => {
		const q = { property: 'qc1Ncs' as const, threshold: 100, minLength: 20, boundary: boundaryId };
		const w = await recipeWeakZonesOf(projectId, recipeId, q, db);
		const { counts, spacing, origin, domainRuns } = recipe.targets;
		const domainOf = expandRuns(domainRuns);
		expect(w.domains).toEqual(recipe.input.domains.map((_, k) => k).filter((k) => w.domains.includes(k)));
		const eligible = Uint8Array.from(domainOf, (d) => (w.domains.includes(d) ? 1 : 0));
		const side = boundarySides({ origin, spacing, counts }, listZoneBoundaries(projectId, db)[0], { geometry: '2d', sectionLine: null });
		const hits = new Float64Array(domainOf.length);
		for (let r = 0; r < 4; r++) {
			const values = regenerate(recipe, r);
			const { zones } = bfsZones(values, eligible, counts.x, counts.z, 100);
			const extent = zones.map((z) => {
				const cols = z.cells.map((c) => c % counts.x);
				return (Math.max(...cols) - Math.min(...cols) + 1) * spacing.x;
			});
			const figures = w.realizations[r];
			expect(figures.realization).toBe(r);
			expect(figures.zones, `realization ${r} zones`).toBe(zones.length);
			expect(figures.largestExtent).toBe(Math.max(0, ...extent));
			expect(figures.largestArea).toBe(Math.max(0, ...zones.map((z) => z.cells.length)) * spacing.x * spacing.z);
			expect(figures.crossesBoundary).toBe(zones.some((z) => z.cells.some((c) => side[c] === 0) && z.cells.some((c) => side[c] === 1)));
			zones.forEach((z, k) => {
				if (extent[k] >= 20) for (const c of z.cells) hits[c] += 1;
			});
		}
		expect(w.crossingProbability).toBe(w.realizations.filter((r) => r.crossesBoundary).length / 4);
		// Not a vacuous check: the realizations have several weak zones, some at least 20 m long.
		expect(w.realizations.every((r) => r.zones > 1)).toBe(true);
		expect(hits.some((h) => h > 0)).toBe(true);
		expectSameBits(
			w.probabilityMap,
			Float64Array.from(hits, (h, c) => (eligible[c] ? h / 4 : NaN))
		);
	});

	it('on a grid of variable cell heights: the same labelling, areas summing the rows’ heights (the provenance’s cell edges), sides at the listed elevations', async () => {
		const userId = db.select({ id: users.id }).from(users).where(eq(users.email, 'analyst@conefield.test')).get()!.id;
		const grouped = listZonations(projectId, db).find((z) => z.name === 'Sand grouped')!;
		const grid = { ...coarse, elevation: { ...coarse.elevation, heights: { bands: [{ from: -6, to: 2, cell: 0.25 }] } } };
		const made = createRecipe(
			projectId,
			userId,
			recipeSetupSchema.parse({ name: 'Weak, fine band', zonationId: grouped.id, seed: 'weak-rect', realizations: 3, grid, domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true })) }),
			db
		).recipe;
		const rect = loadRecipe(projectId, made.id, db).recipe;
		if (rect.targets.kind !== 'rectilinear') throw new Error('expected a rectilinear recipe');
		const t = rect.targets;
		const edges = made.provenance.grid!.zEdges!;
		const heights = t.z.map((_, k) => edges[k + 1] - edges[k]);
		expect(new Set(heights).size).toBeGreaterThan(1);
		const boundary = listZoneBoundaries(projectId, db)[0];
		const w = await recipeWeakZonesOf(projectId, made.id, { property: 'qc1Ncs', threshold: 100, minLength: 20, boundary: boundary.id }, db);
		const domainOf = expandRuns(t.domainRuns);
		const eligible = Uint8Array.from(domainOf, (d) => (w.domains.includes(d) ? 1 : 0));
		const nx = t.x.length;
		const dx = t.x[1] - t.x[0];
		// The side of each cell centre, from the boundary line at the row's own elevation (written here).
		const side = Array.from(domainOf, (_, c) => {
			const z = t.z[Math.floor(c / nx)];
			const f = (boundary.elevationTop - z) / (boundary.elevationTop - boundary.elevationBottom);
			return boundary.chainageTop + f * (boundary.chainageBottom - boundary.chainageTop) <= t.x[c % nx] ? 1 : 0;
		});
		for (let r = 0; r < 3; r++) {
			const { zones } = bfsZones(regenerate(rect, r), eligible, nx, t.z.length, 100);
			const area = (cells: number[]) => cells.reduce((a, c) => a + heights[Math.floor(c / nx)], 0) * dx;
			const extent = zones.map((z) => {
				const cols = z.cells.map((c) => c % nx);
				return (Math.max(...cols) - Math.min(...cols) + 1) * dx;
			});
			expect(w.realizations[r].zones).toBe(zones.length);
			expect(w.realizations[r].largestExtent).toBe(Math.max(0, ...extent));
			// Summed in another order here: equal to a few ulps.
			expectAbsClose(w.realizations[r].largestArea, Math.max(0, ...zones.map((z) => area(z.cells))), 1e-9, `realization ${r} area`);
			expect(w.realizations[r].crossesBoundary).toBe(zones.some((z) => z.cells.some((c) => side[c] === 0) && z.cells.some((c) => side[c] === 1)));
		}
		expect(w.realizations.some((x) => x.zones > 0)).toBe(true);
	});

	it('is cached by hash, property, threshold, minimum length and boundary line, and computed identically after the cache is deleted', async () => {
		const q = { property: 'qc1Ncs' as const, threshold: 90, minLength: 0, boundary: null };
		const a = await recipeWeakZonesOf(projectId, recipeId, q, db);
		expect(db.select().from(recipeWeakZones).where(eq(recipeWeakZones.threshold, '90')).all()).toHaveLength(1);
		expect(a.crossingProbability).toBeNull();
		expect(a.realizations.every((r) => r.crossesBoundary === null)).toBe(true);
		const cached = await recipeWeakZonesOf(projectId, recipeId, q, db);
		expect(cached).toEqual(a);
		db.delete(recipeWeakZones).run();
		const again = await recipeWeakZonesOf(projectId, recipeId, q, db);
		expect(again.realizations).toEqual(a.realizations);
		expectSameBits(again.probabilityMap, a.probabilityMap);
	});

	it('refuses a property the recipe does not simulate and a boundary not in the project (422); a recipe of another project is a 404', async () => {
		await expect(recipeWeakZonesOf(projectId, recipeId, { property: 'Dr', threshold: 0.2, minLength: 0, boundary: null }, db)).rejects.toThrow(InvalidInput);
		await expect(recipeWeakZonesOf(projectId, recipeId, { property: 'Dr', threshold: 0.2, minLength: 0, boundary: null }, db)).rejects.toThrow(/does not simulate Dr/);
		await expect(recipeWeakZonesOf(projectId, recipeId, { property: 'qc1Ncs', threshold: 100, minLength: 0, boundary: 'nope' }, db)).rejects.toThrow('That zone boundary is not in this project.');
		await expect(recipeWeakZonesOf(crypto.randomUUID(), recipeId, { property: 'qc1Ncs', threshold: 100, minLength: 0, boundary: null }, db)).rejects.toMatchObject({ status: 404 });
	});

	it('a deleted recipe takes its cached weak zones with it (no other recipe has the hash)', async () => {
		await recipeWeakZonesOf(projectId, recipeId, { property: 'qc1Ncs', threshold: 80, minLength: 0, boundary: null }, db);
		deleteRecipe(projectId, recipeId, db);
		expect(db.select().from(recipeWeakZones).where(eq(recipeWeakZones.recipeHash, hash)).all()).toHaveLength(0);
	});
});
