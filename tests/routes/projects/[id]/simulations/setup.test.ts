// The recipe setup form's state class against an in-memory API: defaults read off the site, the grid preview by the
// server's own gridDomains, the request body the API takes, and the API's issues shown against their domain rows.
import { describe, expect, it } from 'vitest';
import { RequestFailed, type ProjectApi, type RecipeView } from '../../../../../src/lib/api/index';
import { recipeSetupSchema } from '../../../../../src/lib/schemas/recipe';
import { RecipeSetupForm, freshSeed, parsePercentiles } from '../../../../../src/routes/projects/[id]/simulations/new/setup.svelte';
import { weightedQuantiles } from '../../../../../src/lib/geostat/index';

function memoryApi(fail = false) {
	const sent: unknown[] = [];
	const api = {
		zonations: async () => [
			{
				id: 'z1',
				name: 'By unit',
				description: '',
				domains: [
					{ id: 'sand', name: 'Sand', property: 'qc1Ncs', cellHeight: 0.5, members: [{ unitId: 'u-sand', zone: -1 }] },
					{ id: 'clay', name: 'Clay', property: 'suRatio', cellHeight: null, members: [{ unitId: 'u-clay', zone: -1 }] }
				]
			}
		],
		site: async () => ({ geometry: '2d', sectionLine: [[0, 0], [100, 0]], offLineTolerance: 10, groundwaterElevation: 1, lengthUnit: 'm' }),
		soundings: async () => [
			{ id: 's1', name: 'S1', x: 10, y: 0, chainage: 10, groundElevation: 3, maxDepth: 10 },
			{ id: 's2', name: 'S2', x: 90, y: 0, chainage: 90, groundElevation: 3, maxDepth: 10 }
		],
		units: async () => [
			{ id: 'u-sand', name: 'Sand' },
			{ id: 'u-clay', name: 'Clay' }
		],
		contacts: async () => [
			{ soundingId: 's1', unitId: 'u-sand', topElevation: 3 },
			{ soundingId: 's2', unitId: 'u-sand', topElevation: 3 },
			{ soundingId: 's1', unitId: 'u-clay', topElevation: -1 },
			{ soundingId: 's2', unitId: 'u-clay', topElevation: -1 }
		],
		zoneBoundaries: async () => [],
		recipes: async () => [{ id: 'old' }],
		meshes: async () => [{ id: 'm1', name: 'Model mesh', geometry: '2d', elements: 3, groups: [{ name: 'fill', elements: 1 }, { name: 'foundation', elements: 2 }] }],
		variograms: async (id: string) => (id === 'sand' ? [{ id: 'v1', name: 'Fit', version: 1, createdAt: '2026-01-01T00:00:00Z' }] : []),
		domainSamples: async (id: string) => (id === 'sand' ? { samples: { value: [60, 80, 95] }, weights: [0.5, 0.25, 0.25] } : { samples: { value: [0.2, 0.3] }, weights: [0.5, 0.5] }),
		section: async () => ({ soundings: [], units: [], contacts: [], boundaries: [] }),
		createRecipe: async (body: unknown) => {
			sent.push(body);
			if (fail) throw new RequestFailed('Clay has no saved variogram.', 422, 'invalid', [{ path: ['domains', 1, 'variogramId'], message: 'Clay has no saved variogram.' }]);
			return { id: 'old' } as RecipeView;
		}
	};
	return { api: api as unknown as ProjectApi, sent };
}

describe('RecipeSetupForm', () => {
	it('reads defaults off the site: the section line’s length, the soundings’ depth, the finest domain cell, N 20', async () => {
		const { api } = memoryApi();
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		expect(form.zonationId).toBe('z1');
		expect(form.name).toBe('By unit, 20 realizations');
		expect(form.grid.chainage).toEqual({ from: '0', to: '100', cell: '0.25' });
		expect(form.grid.elevation).toEqual({ from: '-7', to: '3', cell: '0.5' });
		// A domain without a saved variogram starts as not simulated.
		expect(form.rows.map((r) => [r.name, r.simulate, r.dataMin, r.dataMax])).toEqual([
			['Sand', true, 60, 95],
			['Clay', false, 0.2, 0.3]
		]);
	});

	it('previews the grid with the cells of the simulated domains only', async () => {
		const { api } = memoryApi();
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		form.grid.chainage.cell = '10';
		form.grid.elevation.cell = '1';
		const p = form.preview!;
		expect(p.tooBig).toBeNull();
		if (p.tooBig !== null) return;
		// 10 × 10 cells; sand from the ground (3) down to −1: rows with centres 2.5 … −0.5, four of them.
		expect(p.grid.counts).toEqual({ x: 10, y: 1, z: 10 });
		expect([p.names, p.counts]).toEqual([['Sand'], [40]]);
		form.rows[1].simulate = true;
		expect(form.preview!.tooBig === null && form.preview!.counts).toEqual([40, 60]);
		form.grid.chainage.cell = '0.0005';
		expect(form.preview!.tooBig).toBe(2_000_000);
	});

	it('sends the setup the API’s schema takes; an empty field is the default (null)', async () => {
		const { api, sent } = memoryApi();
		let opened: [string, boolean] | null = null;
		const form = new RecipeSetupForm(api, (r, existed) => (opened = [r.id, existed]));
		await form.start(null);
		form.rows[0].maxPerSounding = '';
		form.rows[0].zmax = '120';
		await form.create();
		const body = recipeSetupSchema.parse(sent[0]);
		expect(body.domains[0]).toMatchObject({ simulate: true, variogramId: null, search: { maxData: 16, maxSimulated: 16, maxPerSounding: null, path: 'random', radius: null }, tails: { zmin: null, zmax: 120 } });
		expect(body.domains[1]).toEqual({ domainId: 'clay', simulate: false });
		expect(body.grid).toEqual({ geometry: '2d', chainage: { from: 0, to: 100, cell: 0.25 }, elevation: { from: -7, to: 3, cell: 0.5 } });
		// The API answered with a recipe that was already there (the same hash).
		expect(opened).toEqual(['old', true]);
	});

	it('previews cell heights per unit: 0.25 m in the sand, 1 m below, and sends them as byUnit', async () => {
		const { api, sent } = memoryApi();
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		form.grid.chainage.cell = '10';
		form.grid.elevation.cell = '1';
		form.heightsMode = 'units';
		form.unitHeights[0].cell = '0.25';
		const p = form.preview!;
		if (p.tooBig !== null) throw new Error('too big');
		// Sand from the ground (3) down to −1 at every column: 16 cells of 0.25 m; below it 6 cells of 1 m from −7.
		expect(p.grid.counts.z).toBe(22);
		expect(p.grid.zEdges!.slice(5, 8)).toEqual([-2, -1, -0.75]);
		expect(p.counts).toEqual([160]);
		await form.create();
		const body = recipeSetupSchema.parse(sent[0]);
		expect(body.grid!.elevation).toEqual({ from: -7, to: 3, cell: 1, heights: { byUnit: [{ unitId: 'u-sand', cell: 0.25 }] } });
	});

	it('sends elevation bands, and a mesh with its groups mapped to domains', async () => {
		const { api, sent } = memoryApi();
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		form.heightsMode = 'bands';
		form.bands = [{ from: '-2', to: '3', cell: '0.25' }];
		await form.create();
		expect(recipeSetupSchema.parse(sent[0]).grid!.elevation.heights).toEqual({ bands: [{ from: -2, to: 3, cell: 0.25 }] });
		form.target = 'mesh';
		expect(form.preview).toBeNull();
		form.meshAssign = 'groups';
		form.groupDomains = { foundation: 'sand' };
		await form.create();
		const body = recipeSetupSchema.parse(sent[1]);
		expect(body.grid).toBeUndefined();
		expect(body.mesh).toEqual({ meshId: 'm1', assign: 'groups', groups: [{ group: 'fill', domainId: null }, { group: 'foundation', domainId: 'sand' }] });
	});

	it('shows the API’s issues against their domain row', async () => {
		const { api } = memoryApi(true);
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		await form.create();
		expect(form.problem).toMatch(/Clay has no saved variogram/);
		expect(form.rowIssues(1)).toEqual(['Clay has no saved variogram.']);
		expect(form.rowIssues(0)).toEqual([]);
	});

	it('a uniform baseline includes every domain with data, shows each value as the server will resolve it, and sends the uniform setup', async () => {
		const { api, sent } = memoryApi();
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		form.setKind('uniform');
		expect(form.name).toBe('By unit, uniform P50');
		expect(form.rows.map((r) => r.simulate)).toEqual([true, true]);
		form.percentiles = '33, 50 67';
		expect(form.percentileList).toEqual([33, 50, 67]);
		expect(form.uniformOf(form.rows[0])).toEqual(Array.from(weightedQuantiles([60, 80, 95], [0.5, 0.25, 0.25], [0.33, 0.5, 0.67])));
		await form.create();
		const body = recipeSetupSchema.parse(sent[0]);
		expect(body).toMatchObject({ kind: 'uniform', percentiles: [33, 50, 67], domains: [{ domainId: 'sand', simulate: true }, { domainId: 'clay', simulate: true }] });
		form.percentiles = '0, 50';
		expect(form.percentileList).toBeNull();
		expect(form.uniformOf(form.rows[0])).toBeNull();
		expect(parsePercentiles('50, x')).toBeNull();
		form.setKind('sgs');
		expect(form.rows.map((r) => r.simulate)).toEqual([true, false]);
	});

	it('one path for all realizations: the switch puts every domain on the constant form of its order and back, and the body carries it', async () => {
		const { api, sent } = memoryApi();
		const form = new RecipeSetupForm(api, () => undefined);
		await form.start(null);
		expect(form.constantPaths).toBe(false);
		form.rows[0].path = 'multigrid';
		form.setConstantPaths(true);
		expect(form.rows.map((r) => r.path)).toEqual(['multigrid-constant', 'random-constant']);
		expect(form.constantPaths).toBe(true);
		// The clay is not simulated (no saved variogram): its path does not count.
		expect(form.rows[1].simulate).toBe(false);
		form.rows[1].path = 'random';
		expect(form.constantPaths).toBe(true);
		// The sand back on a path per realization: the switch no longer reads on.
		form.rows[0].path = 'multigrid';
		expect(form.constantPaths).toBe(false);
		form.setConstantPaths(true);
		await form.create();
		const body = recipeSetupSchema.parse(sent[0]);
		if (body.kind === 'uniform') throw new Error('expected an SGS setup');
		expect(body.domains.filter((d) => d.simulate).map((d) => d.search.path)).toEqual(form.rows.filter((r) => r.simulate).map((r) => r.path));
		form.setConstantPaths(false);
		expect(form.rows.map((r) => r.path)).toEqual(['multigrid', 'random']);
		expect(form.constantPaths).toBe(false);
	});

	it('freshSeed gives nine digits', () => {
		expect(freshSeed(() => 0)).toBe('100000000');
		expect(freshSeed(() => 0.999999999)).toMatch(/^\d{9}$/);
	});
});
