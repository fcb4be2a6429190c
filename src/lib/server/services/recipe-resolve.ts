/**
 * Resolving a recipe setup into the engine's recipe: the zonation's domains, each domain's conditioning data
 * (through the domain-samples service, so the domain's data rules apply), declustering weights, for SGS the
 * chosen saved variogram version, kriging, search and tail bounds, for uniform fields the values at the
 * percentiles, and the target grid with each cell's domain read from the stratigraphy. Everything is read from
 * the database; nothing is written here.
 */
import { createRecipe, createUniformRecipe, trendResiduals, uniformValues, weightedMean, type DomainInput, type LinearTrend, type Recipe, type UniformDomainData } from '$lib/geostat';
import { domainTrend } from '$lib/variography';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { getDb } from '$lib/server/db';
import type { DbOrTx } from '$lib/server/db/transaction';
import { InvalidInput, type InputIssue } from '$lib/server/errors';
import { MAX_CELLS, MAX_ENSEMBLE_VALUES, type RecipeSetup, type SgsSetup, type SimulatedDomainSetup, type UniformSetup } from '$lib/schemas/recipe';
import { cellsPerDomain, domainRuns, gridDomains, gridStratigraphy, type GridSpec, type GridStratigraphy } from '$lib/site';
import { domainSamples, type DomainSamples } from './domains';
import { getSite } from './site';
import { listSoundings } from './soundings';
import { listContacts, listUnits, listZoneBoundaries } from './stratigraphy';
import { listVariograms, type VariogramView } from './variograms';
import { listZonations, type ZonationView } from './zonations';

/** A domain as a recipe resolved it. */
export interface ProvenanceDomain {
	domainId: string;
	name: string;
	property: SimulatedProperty;
	/** Its index among the recipe's domains (targets' domain numbers); null when not simulated. */
	index: number | null;
	/** Cells of the grid in the domain (0 when not simulated). */
	cells: number;
	variogram: { id: string; name: string; version: number; transform: DomainInput['transform'] } | null;
	kriging: DomainInput['kriging'] | null;
	/** The simple-kriging mean in the kriged space (0 for normal scores, the declustered data mean for values). */
	mean: number | null;
	search: DomainInput['search'] | null;
	/** The tail bounds in force: as set, or the smallest and largest datum (of the residuals with a trend). */
	tails: { zmin: number; zmax: number } | null;
	/** The linear trend of the mean the variogram's settings remove, when there is one. */
	trend: LinearTrend | null;
	/** The conditioning data: how many, from how many soundings, by which of the domain's rules. */
	data: { samples: number; soundings: number; rules: Omit<DomainSamples['domain'], 'id' | 'name' | 'zonationId' | 'zonationName' | 'property'> } | null;
	/** A uniform recipe's value of the domain at each of its percentiles (absent for 'sgs'). */
	values?: number[];
}

/** What a recipe was resolved from, stored beside it (not hashed). */
export interface RecipeProvenance {
	/** Absent in recipes stored before kinds existed: 'sgs'. */
	kind?: 'sgs' | 'uniform';
	zonation: { id: string; name: string };
	geometry: '2d' | '3d';
	lengthUnit: 'm' | 'ft';
	/** Null for a uniform recipe (nothing random). */
	seed: string | null;
	realizations: number;
	/** A uniform recipe's percentiles, realization by realization. */
	percentiles?: number[];
	grid: GridSpec & { counts: { x: number; y: number; z: number }; cells: number; simulated: number };
	domains: ProvenanceDomain[];
	/** Remarks about the grid and the data (soundings left out, domains without cells …). */
	warnings: string[];
}

/** The stratigraphy a project's grids are read from (soundings located as the section places them). */
export function projectStratigraphy(projectId: string, db: DbOrTx = getDb()): GridStratigraphy {
	const site = getSite(projectId, db);
	return gridStratigraphy({
		sectionLine: site.sectionLine,
		soundings: listSoundings(projectId, db),
		units: listUnits(projectId, db),
		contacts: listContacts(projectId, db),
		boundaries: listZoneBoundaries(projectId, db)
	});
}

/**
 * The engine's input for one simulated domain: its conditioning data (original units, with their sounding) and
 * declustering weights as the domain-samples service gives them, the saved variogram's model and transform, the
 * linear trend of the mean its settings remove (domainTrend: the domain is then simulated on the residuals and
 * the trend added back), the kriging type with its mean (0 in normal-score space; the declustered mean of the
 * values, or of the residuals, when simulated without a transform), the search (its path only when not the
 * default random one, so recipes that do not use it keep their hash), and the tail bounds (null: the data's own
 * extremes, the engine's default; with a trend they bound the residuals). The one place a domain's input is built.
 */
export function domainInput(samples: DomainSamples, variogram: VariogramView, setup: SimulatedDomainSetup): DomainInput {
	const { x, y, z, value, sounding } = samples.samples;
	const transform = variogram.settings.transform;
	const data = value.map((v, i) => ({ x: x[i], y: y[i], z: z[i], value: v, sounding: sounding[i] }));
	const trend: LinearTrend | undefined = domainTrend(samples, variogram.settings)?.trend;
	const kriged = trend ? trendResiduals(data, trend) : value;
	const input: DomainInput = {
		samples: data,
		weights: samples.weights,
		model: variogram.model,
		transform,
		mean: transform === 'normal-score' ? 0 : weightedMean(kriged, samples.weights),
		kriging: setup.kriging,
		search: {
			maxData: setup.search.maxData,
			maxSimulated: setup.search.maxSimulated,
			...(setup.search.maxPerSounding !== null ? { maxPerSounding: setup.search.maxPerSounding } : {}),
			...(setup.search.radius !== null ? { radius: setup.search.radius } : {}),
			...(setup.search.path === 'multigrid' ? { path: 'multigrid' as const } : {})
		}
	};
	if (trend) input.trend = trend;
	if (setup.tails.zmin !== null) input.zmin = setup.tails.zmin;
	if (setup.tails.zmax !== null) input.zmax = setup.tails.zmax;
	return input;
}

/**
 * Resolves a setup into the engine's recipe and its provenance, by kind: sequential Gaussian simulation (kind
 * 'sgs', N realizations) or uniform fields (kind 'uniform', one realization a percentile).
 * @throws InvalidInput (422, with issues) for a zonation not in the project, a grid of the other geometry, a
 *   domain left out or foreign, a simulated domain without data (or, for 'sgs', without saved variogram, with a
 *   variogram of another domain or tail bounds inside the data), a grid too large, or no simulated cell at all
 */
export function resolveRecipe(projectId: string, setup: RecipeSetup, db: DbOrTx = getDb()): { recipe: Recipe; provenance: RecipeProvenance } {
	return setup.kind === 'uniform' ? resolveUniform(projectId, setup, db) : resolveSgs(projectId, setup, db);
}

/** What every kind checks first: the zonation, the grid's geometry, and each domain set up once. */
function resolveZonation<S extends RecipeSetup>(projectId: string, setup: S, issues: InputIssue[], db: DbOrTx) {
	const zonation: ZonationView | undefined = listZonations(projectId, db).find((z) => z.id === setup.zonationId);
	if (!zonation) {
		issues.push({ path: ['zonationId'], message: 'That zonation is not in this project.' });
		fail(issues);
	}
	const z = zonation!;
	const site = getSite(projectId, db);
	if (setup.grid.geometry !== site.geometry) {
		issues.push({ path: ['grid', 'geometry'], message: `The site is ${site.geometry.toUpperCase()}; the grid must be ${site.geometry.toUpperCase()} too.` });
	}
	const list = setup.domains as S['domains'][number][];
	const byId = new Map(list.map((d, k) => [d.domainId, { d, k }]));
	list.forEach((d, k) => {
		if (!z.domains.some((zd) => zd.id === d.domainId)) issues.push({ path: ['domains', k, 'domainId'], message: `Domain ${d.domainId} is not in ${z.name}.` });
	});
	if (new Set(setup.domains.map((d) => d.domainId)).size !== setup.domains.length) {
		issues.push({ path: ['domains'], message: 'A domain is set up twice.' });
	}
	return { z, site, byId };
}

function fail(issues: InputIssue[]): never {
	throw new InvalidInput(issues.map((i) => i.message).join(' '), issues);
}

/**
 * The grid of a recipe, each cell's domain read from the stratigraphy (gridDomains) for the simulated domains of
 * `provenance` (index order), with its size checked against the limits for `n` realizations. Sets each simulated
 * domain's cell count and adds the grid's warnings.
 */
function resolveGrid(projectId: string, z: ZonationView, provenance: ProvenanceDomain[], nDomains: number, setup: RecipeSetup, n: number, issues: InputIssue[], db: DbOrTx) {
	let grid: ReturnType<typeof gridDomains>;
	try {
		const members = provenance.filter((p) => p.index !== null).map((p) => z.domains.find((zd) => zd.id === p.domainId)!.members);
		grid = gridDomains(projectStratigraphy(projectId, db), members, setup.grid);
	} catch (err) {
		issues.push({ path: ['grid'], message: `The grid is not valid: ${(err as Error).message}.` });
		fail(issues);
	}
	const { grid: def, domain, warnings } = grid!;
	const cells = domain.length;
	const counts = cellsPerDomain(domain, nDomains);
	const simulated = counts.reduce((a, b) => a + b, 0);
	const what = setup.kind === 'uniform' ? 'percentiles' : 'realizations';
	if (cells > MAX_CELLS) issues.push({ path: ['grid'], message: `The grid has ${cells.toLocaleString('en')} cells; at most ${MAX_CELLS.toLocaleString('en')} are allowed. Use larger cells or a smaller extent.` });
	else if (simulated === 0) issues.push({ path: ['grid'], message: 'No cell of the grid lies in a simulated domain: check the grid’s extent against the section.' });
	else if (simulated * n > MAX_ENSEMBLE_VALUES) {
		issues.push({
			path: [setup.kind === 'uniform' ? 'percentiles' : 'realizations'],
			message: `${n} ${what} of ${simulated.toLocaleString('en')} simulated cells are more values than an ensemble map holds (${MAX_ENSEMBLE_VALUES.toLocaleString('en')}): use fewer ${what} or larger cells.`
		});
	}
	if (issues.length) fail(issues);
	for (const p of provenance) if (p.index !== null) p.cells = counts[p.index];
	for (const p of provenance) if (p.index !== null && p.cells === 0) warnings.push(`No cell of the grid lies in ${p.name}.`);
	return { targets: { kind: 'grid' as const, ...def, domainRuns: domainRuns(domain) }, def, cells, simulated, warnings };
}

/** The rules a domain's data were taken by, for the provenance. */
function dataOf(samples: DomainSamples): NonNullable<ProvenanceDomain['data']> {
	const { id: _id, name: _name, zonationId: _z, zonationName: _zn, property: _p, ...rules } = samples.domain;
	return { samples: samples.samples.value.length, soundings: new Set(samples.samples.sounding).size, rules };
}

const UNSET = { variogram: null, kriging: null, mean: null, search: null, tails: null, trend: null } as const;

/** A setup of sequential Gaussian simulation into the engine's recipe (kind 'sgs', N realizations). */
function resolveSgs(projectId: string, setup: SgsSetup, db: DbOrTx): { recipe: Recipe; provenance: RecipeProvenance } {
	const issues: InputIssue[] = [];
	const { z, site, byId } = resolveZonation(projectId, setup, issues, db);
	const inputs: DomainInput[] = [];
	const provenance: ProvenanceDomain[] = [];
	for (const zd of z.domains) {
		const entry = byId.get(zd.id);
		const base = { domainId: zd.id, name: zd.name, property: zd.property, cells: 0 };
		if (!entry) {
			issues.push({ path: ['domains'], message: `Say whether ${zd.name} is simulated.` });
			continue;
		}
		const { d, k } = entry;
		if (!d.simulate) {
			provenance.push({ ...base, index: null, ...UNSET, data: null });
			continue;
		}
		const saved = listVariograms(projectId, zd.id, db);
		const variogram = d.variogramId === null ? saved[0] : saved.find((v) => v.id === d.variogramId);
		if (!variogram) {
			issues.push({
				path: ['domains', k, 'variogramId'],
				message: d.variogramId === null ? `${zd.name} has no saved variogram: fit and save one on the Variography page, or leave the domain out.` : `That variogram is not a saved version of ${zd.name}.`
			});
			continue;
		}
		const samples = domainSamples(projectId, zd.id, db);
		const values = samples.samples.value;
		if (values.length === 0) {
			issues.push({ path: ['domains', k], message: `${zd.name} has no conditioning data: no sounding reading lies in it.` });
			continue;
		}
		let input: DomainInput;
		try {
			input = domainInput(samples, variogram, d);
		} catch (err) {
			issues.push({ path: ['domains', k, 'variogramId'], message: `The trend of ${zd.name}'s variogram cannot be fitted to its data: ${(err as Error).message}.` });
			continue;
		}
		// The tail bounds bound what is back-transformed: the values, or their residuals from the trend.
		const kriged = input.trend ? trendResiduals(input.samples, input.trend) : values;
		let lo = Infinity;
		let hi = -Infinity;
		for (const v of kriged) {
			if (v < lo) lo = v;
			if (v > hi) hi = v;
		}
		const unit = PROPERTY_INFO[zd.property].unit;
		const u = unit === '–' ? '' : ` ${unit}`;
		const what = input.trend ? 'residual' : 'datum';
		if (d.tails.zmin !== null && d.tails.zmin > lo) issues.push({ path: ['domains', k, 'tails', 'zmin'], message: `The lower tail bound of ${zd.name} must not be above its smallest ${what} (${lo}${u}).` });
		if (d.tails.zmax !== null && d.tails.zmax < hi) issues.push({ path: ['domains', k, 'tails', 'zmax'], message: `The upper tail bound of ${zd.name} must not be below its largest ${what} (${hi}${u}).` });
		provenance.push({
			...base,
			index: inputs.length,
			variogram: { id: variogram.id, name: variogram.name, version: variogram.version, transform: input.transform },
			kriging: input.kriging,
			mean: input.mean ?? 0,
			search: input.search,
			tails: { zmin: d.tails.zmin ?? lo, zmax: d.tails.zmax ?? hi },
			trend: input.trend ?? null,
			data: dataOf(samples)
		});
		inputs.push(input);
	}
	if (issues.length) fail(issues);
	if (inputs.length === 0) {
		issues.push({ path: ['domains'], message: 'Simulate at least one domain.' });
		fail(issues);
	}
	const grid = resolveGrid(projectId, z, provenance, inputs.length, setup, setup.realizations, issues, db);
	let recipe: Recipe;
	try {
		recipe = createRecipe({ seed: setup.seed, domains: inputs }, grid.targets, { realizations: setup.realizations });
	} catch (err) {
		issues.push({ path: [], message: `The engine refused the recipe: ${(err as Error).message}.` });
		fail(issues);
	}
	return {
		recipe: recipe!,
		provenance: {
			kind: 'sgs',
			zonation: { id: z.id, name: z.name },
			geometry: site.geometry,
			lengthUnit: site.lengthUnit,
			seed: setup.seed,
			realizations: setup.realizations,
			grid: { ...setup.grid, counts: grid.def.counts, cells: grid.cells, simulated: grid.simulated },
			domains: provenance,
			warnings: grid.warnings
		}
	};
}

/**
 * A uniform setup into the engine's recipe (kind 'uniform'): each included domain's conditioning data and
 * declustering weights, as the domain-samples service gives them (after the domain's rules), and its value at
 * each percentile (the engine's uniformValues: the weighted plotting positions of the domain statistics).
 */
function resolveUniform(projectId: string, setup: UniformSetup, db: DbOrTx): { recipe: Recipe; provenance: RecipeProvenance } {
	const issues: InputIssue[] = [];
	const { z, site, byId } = resolveZonation(projectId, setup, issues, db);
	const inputs: UniformDomainData[] = [];
	const provenance: ProvenanceDomain[] = [];
	for (const zd of z.domains) {
		const entry = byId.get(zd.id);
		const base = { domainId: zd.id, name: zd.name, property: zd.property, cells: 0, ...UNSET };
		if (!entry) {
			issues.push({ path: ['domains'], message: `Say whether ${zd.name} is included.` });
			continue;
		}
		if (!entry.d.simulate) {
			provenance.push({ ...base, index: null, data: null });
			continue;
		}
		const samples = domainSamples(projectId, zd.id, db);
		const { x, y, z: el, value, sounding } = samples.samples;
		if (value.length === 0) {
			issues.push({ path: ['domains', entry.k], message: `${zd.name} has no conditioning data: no sounding reading lies in it.` });
			continue;
		}
		provenance.push({ ...base, index: inputs.length, data: dataOf(samples), values: uniformValues(value, samples.weights, setup.percentiles) });
		inputs.push({ samples: value.map((v, i) => ({ x: x[i], y: y[i], z: el[i], value: v, sounding: sounding[i] })), weights: samples.weights });
	}
	if (issues.length) fail(issues);
	if (inputs.length === 0) {
		issues.push({ path: ['domains'], message: 'Include at least one domain.' });
		fail(issues);
	}
	const grid = resolveGrid(projectId, z, provenance, inputs.length, setup, setup.percentiles.length, issues, db);
	let recipe: Recipe;
	try {
		recipe = createUniformRecipe(setup.percentiles, inputs, grid.targets);
	} catch (err) {
		issues.push({ path: [], message: `The engine refused the recipe: ${(err as Error).message}.` });
		fail(issues);
	}
	return {
		recipe: recipe!,
		provenance: {
			kind: 'uniform',
			zonation: { id: z.id, name: z.name },
			geometry: site.geometry,
			lengthUnit: site.lengthUnit,
			seed: null,
			realizations: setup.percentiles.length,
			percentiles: setup.percentiles,
			grid: { ...setup.grid, counts: grid.def.counts, cells: grid.cells, simulated: grid.simulated },
			domains: provenance,
			warnings: grid.warnings
		}
	};
}
