import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { users } from '../../../src/lib/server/db/schema';
import { soundings } from '../../../src/lib/server/db/site-schema';
import { recipeSummaries, recipes as recipesTable } from '../../../src/lib/server/db/recipe-schema';
import { InvalidInput, ServiceError } from '../../../src/lib/server/errors';
import { seedDemo } from '../../../src/lib/server/services/demo';
import { domainSamples } from '../../../src/lib/server/services/domains';
import { createRecipe, deleteRecipe, getRecipe, listRecipes, loadRecipe, recipeDocument } from '../../../src/lib/server/services/recipes';
import { deleteSummaries, recipeRealization, recipeSummary } from '../../../src/lib/server/services/summaries';
import { listVariograms, saveVariogram } from '../../../src/lib/server/services/variograms';
import { createZonation, listZonations, updateDomain, type ZonationView } from '../../../src/lib/server/services/zonations';
import { stopRealizations } from '../../../src/lib/server/realizations';
import { recipeSetupSchema, type RecipeSetupInput } from '../../../src/lib/schemas/recipe';
import { canonicalJson, regenerate, sha256, weightedQuantiles, type SgsRecipe } from '../../../src/lib/geostat/index';
import { expandRuns } from '../../../src/lib/plots/raster';
import { ensembleMap } from '../../../src/lib/ensemble/index';
import { listUnits } from '../../../src/lib/server/services/stratigraphy';
import { expectSameBits } from '../../asserts';

let db: Db;
let projectId: string;
let userId: string;
let split: ZonationView;

// A coarse grid over the demo section keeps each realization to a few hundred cells.
const coarse = { geometry: '2d', chainage: { from: 0, to: 400, cell: 10 }, elevation: { from: -12, to: 5, cell: 1 } } as const;

function setup(over: Partial<RecipeSetupInput> = {}, z: ZonationView = split) {
	return recipeSetupSchema.parse({
		name: 'Coarse',
		zonationId: z.id,
		seed: '42',
		realizations: 4,
		grid: coarse,
		domains: z.domains.map((d) => ({ domainId: d.id, simulate: true })),
		...over
	});
}

function invalid(fn: () => unknown): InvalidInput {
	try {
		fn();
	} catch (err) {
		if (err instanceof InvalidInput) return err;
		throw err;
	}
	throw new Error('expected InvalidInput');
}

beforeAll(async () => {
	db = openDatabase(':memory:');
	projectId = (await seedDemo(db))!;
	userId = db.select({ id: users.id }).from(users).where(eq(users.email, 'analyst@conefield.test')).get()!.id;
	split = listZonations(projectId, db).find((z) => z.name === 'Sand split at channel')!;
}, 120_000);
afterAll(() => stopRealizations());

describe('createRecipe(projectId, userId, setup) — identity', () => {
	it('the same setup gives the same hash: the second creation returns the stored recipe and writes nothing', () => {
		const a = createRecipe(projectId, userId, setup(), db);
		const b = createRecipe(projectId, userId, setup({ name: 'Another name' }), db);
		expect(a.created).toBe(true);
		expect(b.created).toBe(false);
		expect(b.recipe.id).toBe(a.recipe.id);
		expect(b.recipe.name).toBe('Coarse');
		expect(a.recipe.hash).toMatch(/^[0-9a-f]{64}$/);
		expect(listRecipes(projectId, db).filter((r) => r.hash === a.recipe.hash)).toHaveLength(1);
	});

	it('recipeDocument is the canonical JSON whose SHA-256 is the hash, with kind sgs and N', () => {
		const { recipe } = createRecipe(projectId, userId, setup(), db);
		const { text, hash } = recipeDocument(projectId, recipe.id, db);
		expect(sha256(text)).toBe(hash);
		expect(canonicalJson(JSON.parse(text))).toBe(text);
		const parsed = JSON.parse(text);
		expect([parsed.kind, parsed.realizations]).toEqual(['sgs', 4]);
		expect(recipe.engineVersion).toBe(parsed.engineVersion);
	});

	it('a changed seed, N, grid, kriging or search path gives a new hash; the default random path is left out of the recipe', () => {
		const base = createRecipe(projectId, userId, setup(), db).recipe.hash;
		const variants = [
			setup({ name: 'Seed', seed: '43' }),
			setup({ name: 'N', realizations: 5 }),
			setup({ name: 'Grid', grid: { ...coarse, chainage: { from: 0, to: 400, cell: 8 } } }),
			setup({ name: 'Kriging', domains: split.domains.map((d, k) => ({ domainId: d.id, simulate: true, kriging: k === 0 ? 'ordinary' : 'simple' })) }),
			setup({ name: 'Path', domains: split.domains.map((d, k) => ({ domainId: d.id, simulate: true, search: { path: k === 0 ? 'multigrid' : k === 1 ? 'random-constant' : 'random' } })) })
		];
		const hashes = variants.map((v) => createRecipe(projectId, userId, v, db).recipe.hash);
		expect(new Set([base, ...hashes]).size).toBe(6);
		const path = createRecipe(projectId, userId, variants[4], db).recipe;
		const doc = loadRecipe(projectId, path.id, db).recipe as SgsRecipe;
		expect(doc.input.domains.map((d) => d.search.path)).toEqual(['multigrid', 'random-constant', undefined, undefined, undefined]);
	});

	it('a new variogram version changes the hash when the newest is taken, not when the old version is named', () => {
		const dense = split.domains.find((d) => d.name === 'Dense sand')!;
		const old = listVariograms(projectId, dense.id, db)[0];
		const named = (name: string) =>
			setup({ name, domains: split.domains.map((d) => ({ domainId: d.id, simulate: true, variogramId: d.id === dense.id ? old.id : null })) });
		const before = createRecipe(projectId, userId, setup({ name: 'Before' }), db).recipe.hash;
		expect(createRecipe(projectId, userId, named('Named'), db).recipe.hash).toBe(before);
		saveVariogram(projectId, dense.id, userId, { ...old, model: { ...old.model, structures: old.model.structures.map((s) => ({ ...s, rangeVertical: s.rangeVertical * 1.1 })) }, note: '' }, db);
		const after = createRecipe(projectId, userId, setup({ name: 'After' }), db);
		expect(after.recipe.hash).not.toBe(before);
		expect(after.recipe.provenance.domains.find((d) => d.domainId === dense.id)!.variogram!.version).toBe(old.version + 1);
		expect(createRecipe(projectId, userId, named('Named again'), db).recipe.hash).toBe(before);
	});

	it('a changed datum (a sounding’s ground elevation) or data rule (averaging) gives a new hash', () => {
		const before = createRecipe(projectId, userId, setup({ name: 'Data before' }), db).recipe.hash;
		const row = db.select().from(soundings).where(eq(soundings.projectId, projectId)).get()!;
		db.update(soundings).set({ groundElevation: row.groundElevation + 0.01 }).where(eq(soundings.id, row.id)).run();
		const datum = createRecipe(projectId, userId, setup({ name: 'Datum' }), db).recipe.hash;
		db.update(soundings).set({ groundElevation: row.groundElevation }).where(eq(soundings.id, row.id)).run();
		expect(datum).not.toBe(before);
		expect(createRecipe(projectId, userId, setup({ name: 'Data restored' }), db).recipe.hash).toBe(before);
		const clay = split.domains[0];
		updateDomain(projectId, clay.id, { averaging: 'median' }, db);
		const rule = createRecipe(projectId, userId, setup({ name: 'Rule' }), db).recipe.hash;
		updateDomain(projectId, clay.id, { averaging: clay.averaging }, db);
		expect(rule).not.toBe(before);
	});

	it('a recipe resolves exactly the readings its domain rules keep (the domain-samples service’s samples and weights)', () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Resolved' }), db);
		const { recipe: doc } = loadRecipe(projectId, recipe.id, db);
		const clay = split.domains[0];
		const kept = domainSamples(projectId, clay.id, db);
		const d0 = doc.input.domains[recipe.provenance.domains.find((d) => d.domainId === clay.id)!.index!];
		expect(d0.samples.map((s) => s.value)).toEqual(kept.samples.value);
		expect(d0.samples.map((s) => s.z)).toEqual(kept.samples.z);
		expect(d0.weights).toEqual(kept.weights);
		// Averaged to 0.2 m, the domain keeps far fewer samples than it has readings.
		updateDomain(projectId, clay.id, { averaging: 'none' }, db);
		const every = domainSamples(projectId, clay.id, db).samples.value.length;
		updateDomain(projectId, clay.id, { averaging: clay.averaging }, db);
		expect(every).toBeGreaterThan(5 * d0.samples.length);
	});

	it('provenance names the zonation, each domain’s variogram version, rules, cells and the grid', () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Provenance' }), db);
		const p = recipe.provenance;
		expect(p.zonation).toEqual({ id: split.id, name: split.name });
		expect(p.grid!.counts).toEqual({ x: 40, y: 1, z: 17 });
		expect(p.domains.map((d) => d.name)).toEqual(split.domains.map((d) => d.name));
		for (const d of p.domains) {
			expect(d.variogram).toMatchObject({ name: d.name, version: expect.any(Number), transform: 'normal-score' });
			expect(d.data?.rules).toMatchObject({ cellHeight: 0.2, averaging: 'mean' });
			expect(d.cells).toBeGreaterThan(0);
		}
		expect(p.domains.reduce((a, d) => a + d.cells, 0)).toBe(p.grid!.simulated);
		expect(getRecipe(projectId, recipe.id, db).createdBy?.name).toBe('Ana Analyst');
	});

	it('a variogram that removes a linear trend of the mean puts the trend in the recipe (residuals simulated, trend added back)', () => {
		const dense = split.domains.find((d) => d.name === 'Dense sand')!;
		const old = listVariograms(projectId, dense.id, db)[0];
		const v = saveVariogram(projectId, dense.id, userId, { ...old, name: 'With a trend', settings: { ...old.settings, trend: 'elevation' }, note: '' }, db);
		const domains = split.domains.map((d) => ({ domainId: d.id, simulate: true, variogramId: d.id === dense.id ? v.id : null }));
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Trend', domains }), db);
		const p = recipe.provenance.domains.find((d) => d.domainId === dense.id)!;
		expect(p.trend).not.toBeNull();
		expect(p.trend!.gradient.z).not.toBe(0);
		const doc = loadRecipe(projectId, recipe.id, db).recipe as SgsRecipe;
		expect(doc.input.domains[p.index!].trend).toEqual(p.trend);
		expect(doc.input.domains.filter((d) => d.trend).length).toBe(1);
		// The tails default to the residuals' extremes, which straddle 0.
		expect(p.tails!.zmin).toBeLessThan(0);
		expect(p.tails!.zmax).toBeGreaterThan(0);
	});

	it('a domain left out of the simulation gets no cells and no index', () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'No dense', domains: split.domains.map((d) => ({ domainId: d.id, simulate: d.name !== 'Dense sand' })) }), db);
		const dense = recipe.provenance.domains.find((d) => d.name === 'Dense sand')!;
		expect([dense.index, dense.cells, dense.variogram]).toEqual([null, 0, null]);
		expect(loadRecipe(projectId, recipe.id, db).recipe.input.domains).toHaveLength(4);
	});
});

describe('createRecipe — refusals', () => {
	it('a domain without a saved variogram is a 422 naming the domain', () => {
		const units = listUnits(projectId, db);
		const z = createZonation(projectId, { name: 'Dense only', description: '', domains: [{ name: 'Dense', property: 'qc1Ncs', members: [{ unitId: units.find((u) => u.name === 'Dense sand')!.id, zone: -1 }] }] }, db);
		const err = invalid(() => createRecipe(projectId, userId, setup({ name: 'No model' }, z), db));
		expect(err.status).toBe(422);
		expect(err.issues).toEqual([{ path: ['domains', 0, 'variogramId'], message: expect.stringMatching(/^Dense has no saved variogram/) }]);
	});

	it('a zonation of another project, a 3D grid on a 2D site, a domain left unsaid or a foreign one are 422', () => {
		expect(invalid(() => createRecipe(projectId, userId, setup({ zonationId: 'nope' }), db)).issues[0].path).toEqual(['zonationId']);
		const threeD = setup({ grid: { geometry: '3d', x: coarse.chainage, y: coarse.chainage, elevation: coarse.elevation } });
		expect(invalid(() => createRecipe(projectId, userId, threeD, db)).issues[0].path).toEqual(['grid', 'geometry']);
		const missing = setup({ domains: split.domains.slice(1).map((d) => ({ domainId: d.id, simulate: true })) });
		expect(invalid(() => createRecipe(projectId, userId, missing, db)).issues.map((i) => i.message)).toContain('Say whether Overbank clay is simulated.');
		const foreign = setup({ domains: [...split.domains.map((d) => ({ domainId: d.id, simulate: true })), { domainId: 'elsewhere', simulate: false }] });
		expect(invalid(() => createRecipe(projectId, userId, foreign, db)).issues[0].path).toEqual(['domains', 5, 'domainId']);
	});

	it('tail bounds inside the data, nothing simulated, and too many cells are 422', () => {
		const tails = setup({ domains: split.domains.map((d, k) => ({ domainId: d.id, simulate: true, tails: { zmin: k === 1 ? 1e6 : null, zmax: k === 1 ? 2e6 : null } })) });
		expect(invalid(() => createRecipe(projectId, userId, tails, db)).issues[0].path).toEqual(['domains', 1, 'tails', 'zmin']);
		const none = setup({ domains: split.domains.map((d) => ({ domainId: d.id, simulate: false })) });
		expect(invalid(() => createRecipe(projectId, userId, none, db)).message).toBe('Simulate at least one domain.');
		const huge = setup({ grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 0.1 }, elevation: { from: -12, to: 5, cell: 0.05 } } });
		expect(invalid(() => createRecipe(projectId, userId, huge, db)).message).toMatch(/at most 1,000,000 are allowed/);
		const many = setup({ realizations: 500, grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 0.5 }, elevation: { from: -12, to: 5, cell: 0.1 } } });
		expect(invalid(() => createRecipe(projectId, userId, many, db)).issues[0].path).toEqual(['realizations']);
		const outside = setup({ grid: { geometry: '2d', chainage: { from: 1000, to: 1100, cell: 10 }, elevation: { from: 100, to: 110, cell: 1 } } });
		expect(invalid(() => createRecipe(projectId, userId, outside, db)).message).toMatch(/No cell of the grid lies in a simulated domain/);
	});

	it('a new setup under the name of another recipe is a 409; the same setup under any name is the stored recipe', () => {
		const taken = createRecipe(projectId, userId, setup({ name: 'Taken', seed: 'taken' }), db).recipe;
		let status = 0;
		try {
			createRecipe(projectId, userId, setup({ name: 'TAKEN', seed: 'other' }), db);
		} catch (err) {
			status = err instanceof ServiceError ? err.status : -1;
		}
		expect(status).toBe(409);
		expect(createRecipe(projectId, userId, setup({ name: 'Coarse', seed: 'taken' }), db).recipe.id).toBe(taken.id);
	});
});

describe('recipeRealization and recipeSummary (the server’s worker pool)', () => {
	it('recipeRealization(r) is regenerate(recipe, r) bit for bit; r ≥ N is a 404', async () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Pool' }), db);
		const { recipe: doc } = loadRecipe(projectId, recipe.id, db);
		const r2 = await recipeRealization(projectId, recipe.id, 2, db);
		expectSameBits(r2.values, regenerate(doc, 2));
		expect([r2.hash, r2.realization]).toEqual([recipe.hash, 2]);
		await expect(recipeRealization(projectId, recipe.id, 4, db)).rejects.toThrow(/Realization 4 does not exist: the recipe has 4/);
	}, 120_000);

	it('recipeSummary equals ensembleMap over regenerate(0 … N − 1) bit for bit, is cached, and recomputes identically after deletion', async () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Summary' }), db);
		const { recipe: doc } = loadRecipe(projectId, recipe.id, db);
		const here = [0, 1, 2, 3].map((r) => regenerate(doc, r));
		const mean = await recipeSummary(projectId, recipe.id, 'mean', null, db);
		expectSameBits(mean.values, ensembleMap(here, 'mean'));
		expect([mean.stat, mean.threshold, mean.realizations]).toEqual(['mean', null, 4]);
		const below = await recipeSummary(projectId, recipe.id, 'below', 80, db);
		expectSameBits(below.values, ensembleMap(here, 'below', 80));
		const rows = () => db.select().from(recipeSummaries).where(eq(recipeSummaries.recipeHash, recipe.hash)).all();
		expect(rows().map((r) => [r.stat, r.threshold]).sort()).toEqual([
			['below', '80'],
			['mean', '']
		]);
		const bytes = rows().find((r) => r.stat === 'mean')!.values;
		expect(deleteSummaries(recipe.hash, db)).toBe(2);
		const again = await recipeSummary(projectId, recipe.id, 'mean', null, db);
		expectSameBits(again.values, mean.values);
		expect(Buffer.compare(rows().find((r) => r.stat === 'mean')!.values, bytes)).toBe(0);
	}, 120_000);

	it('a recipe of another engine version is a 409 that says to create it again, for realizations and new summaries', async () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Old engine', seed: 'old-engine' }), db);
		const old = JSON.stringify({ ...JSON.parse(recipeDocument(projectId, recipe.id, db).text), engineVersion: 'conefield-sgs/0' });
		db.update(recipesTable).set({ document: old }).where(eq(recipesTable.id, recipe.id)).run();
		for (const attempt of [() => recipeRealization(projectId, recipe.id, 0, db), () => recipeSummary(projectId, recipe.id, 'mean', null, db)]) {
			await expect(attempt()).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/^This recipe was made by engine conefield-sgs\/0; .*Create it again as a new recipe/) });
		}
	});

	it('deleteRecipe removes the recipe and its cached summaries', async () => {
		const { recipe } = createRecipe(projectId, userId, setup({ name: 'Gone', seed: 'gone' }), db);
		await recipeSummary(projectId, recipe.id, 'sd', null, db);
		deleteRecipe(projectId, recipe.id, db);
		expect(() => getRecipe(projectId, recipe.id, db)).toThrow('Recipe not found.');
		expect(db.select().from(recipeSummaries).where(eq(recipeSummaries.recipeHash, recipe.hash)).all()).toEqual([]);
		expect(() => deleteRecipe(projectId, recipe.id, db)).toThrow(ServiceError);
	}, 120_000);
});

describe('uniform recipes (kind uniform)', () => {
	const uniform = (over: Record<string, unknown> = {}, z: ZonationView = split) =>
		recipeSetupSchema.parse({
			kind: 'uniform',
			name: 'Baseline',
			zonationId: z.id,
			percentiles: [33, 50, 67],
			grid: coarse,
			domains: z.domains.map((d) => ({ domainId: d.id, simulate: true })),
			...over
		});

	it('each domain’s values are the declustered percentiles of its kept data (domain-samples: weighted plotting positions), P50 the domain page’s P50', () => {
		const { recipe } = createRecipe(projectId, userId, uniform(), db);
		expect([recipe.kind, recipe.realizations, recipe.provenance.kind, recipe.provenance.percentiles, recipe.provenance.seed]).toEqual(['uniform', 3, 'uniform', [33, 50, 67], null]);
		const doc = loadRecipe(projectId, recipe.id, db).recipe;
		expect(doc.kind).toBe('uniform');
		if (doc.kind !== 'uniform') return;
		for (const p of recipe.provenance.domains) {
			const s = domainSamples(projectId, p.domainId, db);
			const [p33, p50, p67] = weightedQuantiles(s.samples.value, s.weights, [0.33, 0.5, 0.67]);
			expect(p.values, p.name).toEqual([p33, p50, p67]);
			expect(p.values![1]).toBe(s.stats.p50);
			expect(doc.input.domains[p.index!].values).toEqual(p.values);
			expect(doc.input.domains[p.index!].samples.map((x) => x.value)).toEqual(s.samples.value);
			expect(doc.input.domains[p.index!].weights).toEqual(s.weights);
		}
	});

	it('a sensitivity list gives one realization per percentile, regenerated on the server as here; r ≥ N is a 404', async () => {
		const { recipe } = createRecipe(projectId, userId, uniform(), db);
		const doc = loadRecipe(projectId, recipe.id, db).recipe;
		const domainOf = expandRuns((doc.targets as { domainRuns: [number, number][] }).domainRuns);
		const dense = recipe.provenance.domains.find((d) => d.name === 'Dense sand')!;
		for (let r = 0; r < 3; r++) {
			const server = await recipeRealization(projectId, recipe.id, r, db);
			expectSameBits(server.values, regenerate(doc, r), `realization ${r}`);
			for (let i = 0; i < domainOf.length; i++) if (domainOf[i] === dense.index) expect(server.values[i]).toBe(dense.values![r]);
		}
		await expect(recipeRealization(projectId, recipe.id, 3, db)).rejects.toMatchObject({ status: 404 });
		const mean = await recipeSummary(projectId, recipe.id, 'mean', null, db);
		expectSameBits(mean.values, ensembleMap([0, 1, 2].map((r) => regenerate(doc, r)), 'mean'));
	});

	it('on a grid of variable cell heights (rectilinear targets) each domain takes its percentile in every cell of it; a setup with neither grid nor mesh, or both, is refused', async () => {
		const grid = { ...coarse, elevation: { ...coarse.elevation, heights: { bands: [{ from: -4, to: 0, cell: 0.25 }] } } };
		const { recipe } = createRecipe(projectId, userId, uniform({ name: 'Baseline, fine band', grid }), db);
		const doc = loadRecipe(projectId, recipe.id, db).recipe;
		expect(doc.targets.kind).toBe('rectilinear');
		expect(recipe.provenance.grid!.zEdges!.length).toBe(recipe.provenance.grid!.counts.z + 1);
		const domainOf = expandRuns((doc.targets as { domainRuns: [number, number][] }).domainRuns);
		for (let r = 0; r < 3; r++) {
			const server = await recipeRealization(projectId, recipe.id, r, db);
			expectSameBits(server.values, regenerate(doc, r), `realization ${r}`);
			for (const p of recipe.provenance.domains) {
				if (p.index === null) continue;
				const cells = Array.from(domainOf).flatMap((d, i) => (d === p.index ? [server.values[i]] : []));
				expect(cells.length, p.name).toBe(p.cells);
				expect(new Set(cells), p.name).toEqual(new Set([p.values![r]]));
			}
		}
		const { grid: _g, ...none } = uniform();
		expect(recipeSetupSchema.safeParse(none).success).toBe(false);
		expect(recipeSetupSchema.safeParse({ ...uniform(), mesh: { meshId: 'm', assign: 'stratigraphy' } }).success).toBe(false);
	});

	it('the same percentiles on the same grid are the same recipe; another order or percentile is another', () => {
		const a = createRecipe(projectId, userId, uniform(), db).recipe;
		expect(createRecipe(projectId, userId, uniform({ name: 'Baseline again' }), db).recipe.id).toBe(a.id);
		expect(createRecipe(projectId, userId, uniform({ name: 'Reordered', percentiles: [50, 33, 67] }), db).recipe.hash).not.toBe(a.hash);
		expect(createRecipe(projectId, userId, uniform({ name: 'P50 only', percentiles: undefined }), db).recipe.realizations).toBe(1);
	});

	it('refuses a percentile outside (0, 100), a repeated one, and a domain without data (422), and a domain left unsaid', () => {
		expect(recipeSetupSchema.safeParse({ ...uniform(), percentiles: [0, 50] }).success).toBe(false);
		expect(recipeSetupSchema.safeParse({ ...uniform(), percentiles: [50, 50] }).success).toBe(false);
		expect(recipeSetupSchema.safeParse({ ...uniform(), seed: '1' }).success).toBe(false);
		const empty = updateDomainRulesToNothing();
		const err = invalid(() => createRecipe(projectId, userId, uniform({ name: 'Empty' }), db));
		expect(err.message).toMatch(new RegExp(`${empty} has no conditioning data`));
		restoreRules();
		const unsaid = invalid(() => createRecipe(projectId, userId, uniform({ name: 'Unsaid', domains: split.domains.slice(1).map((d) => ({ domainId: d.id, simulate: true })) }), db));
		expect(unsaid.message).toMatch(/Say whether Overbank clay is included/);
	});
});

let savedRules: unknown;
/** Leaves the first domain of the split zonation without data (a minimum depth below every sounding); returns its name. */
function updateDomainRulesToNothing(): string {
	const d = split.domains[0];
	savedRules = d.rules;
	updateDomain(projectId, d.id, { rules: { ...d.rules, minDepth: 500 } }, db);
	return d.name;
}
function restoreRules(): void {
	updateDomain(projectId, split.domains[0].id, { rules: savedRules as never }, db);
}
