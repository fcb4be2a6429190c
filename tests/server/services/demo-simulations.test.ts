import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { seedDemo } from '../../../src/lib/server/services/demo';
import { DEMO_BASELINE_ZONATION, DEMO_GRID, DEMO_PERCENTILES, DEMO_REALIZATIONS, DEMO_SEED } from '../../../src/lib/server/services/demo-simulations';
import { domainSamples } from '../../../src/lib/server/services/domains';
import { getRecipe, listRecipes, loadRecipe } from '../../../src/lib/server/services/recipes';
import { listVariograms } from '../../../src/lib/server/services/variograms';
import { listZonations } from '../../../src/lib/server/services/zonations';
import { ensembleOf, stopRealizations } from '../../../src/lib/server/realizations';
import { checkRealizations, type DomainCheck } from '../../../src/lib/ensemble/index';
import type { SgsRecipe } from '../../../src/lib/geostat/index';

let db: Db;
let projectId: string;
let recipe: SgsRecipe;
let checks: DomainCheck[];

beforeAll(async () => {
	db = openDatabase(':memory:');
	projectId = (await seedDemo(db))!;
	const split = listRecipes(projectId, db).find((r) => r.name.startsWith('Sand split at channel'))!;
	const loaded = loadRecipe(projectId, split.id, db);
	recipe = loaded.recipe as SgsRecipe;
	// The 20 realizations on the server's worker pool, as the summary endpoint makes them.
	checks = checkRealizations(recipe, await ensembleOf(loaded.hash, recipe));
}, 600_000);
afterAll(() => stopRealizations());

describe('the demo’s simulations', () => {
	it('every demo domain has a saved variogram, and each zonation a recipe on one grid with one seed and 20 realizations', () => {
		const zonations = listZonations(projectId, db);
		for (const z of zonations) for (const d of z.domains) expect(listVariograms(projectId, d.id, db).length, d.name).toBeGreaterThan(0);
		const recipes = listRecipes(projectId, db).filter((r) => r.kind === 'sgs');
		expect(recipes.map((r) => r.zonationId).sort()).toEqual(zonations.map((z) => z.id).sort());
		for (const r of recipes) {
			const view = getRecipe(projectId, r.id, db);
			expect(view.setup.kind).toBe('sgs');
			if (view.setup.kind !== 'sgs') continue;
			expect([view.realizations, view.setup.seed, view.setup.grid]).toEqual([DEMO_REALIZATIONS, DEMO_SEED, DEMO_GRID]);
			expect(view.provenance.domains.every((d) => d.cells > 0)).toBe(true);
		}
		expect(listRecipes(projectId, db)[0].name).toMatch(/^Sand split at channel/);
	});

	it('ships a uniform baseline of the grouped zonation at P33, P50 and P67 on the same grid, each value the declustered percentile the domain page shows', () => {
		const uniform = listRecipes(projectId, db).filter((r) => r.kind === 'uniform');
		expect(uniform).toHaveLength(1);
		const view = getRecipe(projectId, uniform[0].id, db);
		expect(view.zonationId).toBe(listZonations(projectId, db).find((z) => z.name === DEMO_BASELINE_ZONATION)!.id);
		expect([view.realizations, view.provenance.percentiles, view.setup.grid]).toEqual([3, DEMO_PERCENTILES, DEMO_GRID]);
		for (const d of view.provenance.domains) {
			expect(d.cells, d.name).toBeGreaterThan(0);
			// The P50 of the domain's statistics (the samples endpoint, the domain page) is the value of realization 1.
			expect(d.values![1], d.name).toBe(domainSamples(projectId, d.domainId, db).stats.p50);
			expect(d.values![0]).toBeLessThanOrEqual(d.values![1]);
			expect(d.values![1]).toBeLessThanOrEqual(d.values![2]);
		}
	});

	// Statistics of the 20 realizations of the split recipe, domain by domain. Sequential Gaussian simulation
	// reproduces the declustered histogram and the variogram model only up to ergodic fluctuations, which grow
	// with the range relative to the domain's size (Deutsch & Journel 1998, ch. V.1.5 and V.2.3; Goovaerts 1997,
	// ch. 8.1): the tolerances below are our own, stated for domains a few ranges across.
	it('histogram reproduction: every realization within a KS distance of 0.15 of the declustered data, the median within 0.10', () => {
		for (const c of checks) {
			expect(c.histogram.ks, `domain ${c.domain}`).toHaveLength(20);
			expect(c.histogram.median, `domain ${c.domain} median KS`).toBeLessThanOrEqual(0.1);
			expect(c.histogram.worst, `domain ${c.domain} worst KS`).toBeLessThanOrEqual(0.15);
		}
	});

	it('vertical variogram reproduction: the mean over 20 realizations of the normal scores’ γ within 0.2 of the sill of the model, lags within the range', () => {
		for (const c of checks) {
			const vertical = c.variogram!.directions.find((d) => d.direction === 'vertical')!;
			const model = recipe.input.domains[c.domain].model;
			const range = Math.max(...model.structures.filter((s) => s.type !== 'nugget').map((s) => s.rangeVertical ?? 0));
			const within = vertical.lags.filter((l) => l.h <= range && l.pairs > 0);
			expect(within.length, `domain ${c.domain} lags`).toBeGreaterThanOrEqual(3);
			const deviation = within.reduce((a, l) => a + Math.abs(l.mean - l.model), 0) / within.length / c.variogram!.sill;
			expect(deviation, `domain ${c.domain} mean |γ − model| / sill`).toBeLessThanOrEqual(0.2);
		}
	});

	it('the E-type next to the conditioning data is close to the data: correlation ≥ 0.95, mean |E-type − datum| ≤ 0.2 of the data SD', () => {
		for (const c of checks) {
			const d = c.data;
			expect(d.inCells / d.data, `domain ${c.domain} data in their domain's cells`).toBeGreaterThanOrEqual(0.9);
			expect(d.etypeCorrelation, `domain ${c.domain} correlation`).toBeGreaterThanOrEqual(0.95);
			const mad = d.pairs.reduce((a, p) => a + Math.abs(p.etype - p.datum), 0) / d.pairs.length;
			expect(mad / d.dataSd, `domain ${c.domain} mean |E-type − datum| / SD`).toBeLessThanOrEqual(0.2);
			expect(d.verdict.level).toBe('ok');
		}
	});
});
