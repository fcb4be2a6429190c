/**
 * Resolving a recipe setup into the engine's recipe: the zonation's domains, each domain's conditioning data
 * (through the domain-samples service, so the domain's data rules apply), declustering weights, for SGS the
 * chosen saved variogram version, kriging, search and tail bounds, for uniform fields the values at the
 * percentiles, and the target grid with each cell's domain read from the stratigraphy. Everything is read from
 * the database; nothing is written here.
 */
import { createRecipe, createUniformRecipe, trendResiduals, uniformValues, weightedMean, type DomainInput, type LinearTrend, type Recipe, type TargetDefinition, type UniformDomainData } from '$lib/geostat';
import { domainTrend } from '$lib/variography';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { getDb } from '$lib/server/db';
import type { DbOrTx } from '$lib/server/db/transaction';
import { InvalidInput, type InputIssue } from '$lib/server/errors';
import { MAX_CELLS, MAX_ENSEMBLE_VALUES, MAX_MESH_ELEMENTS, type GridSetup, type MeshTargetSetup, type RecipeSetup, type SgsSetup, type SimulatedDomainSetup, type UniformSetup } from '$lib/schemas/recipe';
import {
	axesDomains,
	cellsPerDomain,
	domainRuns,
	elevationCells,
	gridDefinition,
	gridDomains,
	gridStratigraphy,
	pointDomains,
	unitHeightBands,
	type GridSpec,
	type GridStratigraphy,
	type HeightBand
} from '$lib/site';
import type { Member } from '$lib/site';
import { getMesh, meshColumns } from './meshes';
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

/** The grid a recipe targets, as resolved: the spec, its counts and, with variable cell heights, the elevation cells. */
export type ProvenanceGrid = GridSpec & {
	counts: { x: number; y: number; z: number };
	cells: number;
	simulated: number;
	/** Variable cell heights: the counts.z + 1 cell edges along the elevation, ascending (the engine holds the centres). */
	zEdges?: number[];
};

/** The mesh a recipe targets. */
export interface ProvenanceMesh {
	id: string;
	name: string;
	elements: number;
	simulated: number;
	/** How elements take their domains: the stratigraphy at the centroid, or the element's group. */
	assign: 'stratigraphy' | 'groups';
	/** The group → domain mapping (domain names; null: not simulated). */
	groups?: { group: string; domain: string | null }[];
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
	/** The grid targeted; null for a mesh. */
	grid: ProvenanceGrid | null;
	/** The mesh targeted (absent for a grid). */
	mesh?: ProvenanceMesh;
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
			...(setup.search.path !== 'random' ? { path: setup.search.path } : {})
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
	if (setup.grid && setup.grid.geometry !== site.geometry) {
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

/** The engine's recipe from `make`; a refusal by the engine becomes an issue of the setup (422). */
function engineRecipe(make: () => Recipe, issues: InputIssue[]): Recipe {
	try {
		return make();
	} catch (err) {
		issues.push({ path: [], message: `The engine refused the recipe: ${(err as Error).message}.` });
		fail(issues);
	}
}

/**
 * The targets of a recipe (the grid, a rectilinear grid of variable cell heights, or a mesh's centroids), each
 * target's domain read from the stratigraphy (or a mesh element's group) for the simulated domains of
 * `provenance` (index order), with their number checked against the limits for `n` realizations (a uniform
 * recipe's percentiles). Sets each simulated domain's target count and gives the provenance's grid or mesh.
 */
function resolveTargets(projectId: string, site: { geometry: '2d' | '3d' }, z: ZonationView, provenance: ProvenanceDomain[], nDomains: number, setup: RecipeSetup, n: number, issues: InputIssue[], db: DbOrTx) {
	const members = provenance.filter((p) => p.index !== null).map((p) => z.domains.find((zd) => zd.id === p.domainId)!.members);
	let resolved: ResolvedTargets;
	try {
		resolved = setup.mesh
			? meshTargets(projectId, site.geometry, setup.mesh, members, z.domains, provenance, db)
			: gridTargets(projectStratigraphy(projectId, db), members, setup.grid!);
	} catch (err) {
		if (err instanceof InvalidInput) throw err;
		issues.push({ path: [setup.mesh ? 'mesh' : 'grid'], message: `The ${setup.mesh ? 'mesh' : 'grid'} is not valid: ${(err as Error).message}.` });
		fail(issues);
	}
	const { targets, domain, warnings } = resolved!;
	const cells = domain.length;
	const counts = cellsPerDomain(domain, nDomains);
	const simulated = counts.reduce((a, b) => a + b, 0);
	const limit = setup.mesh ? MAX_MESH_ELEMENTS : MAX_CELLS;
	const what = setup.mesh ? 'elements' : 'cells';
	const many = setup.kind === 'uniform' ? 'percentiles' : 'realizations';
	if (cells > limit) issues.push({ path: [setup.mesh ? 'mesh' : 'grid'], message: `The ${setup.mesh ? 'mesh' : 'grid'} has ${cells.toLocaleString('en')} ${what}; at most ${limit.toLocaleString('en')} are allowed.${setup.mesh ? '' : ' Use larger cells or a smaller extent.'}` });
	else if (simulated === 0) issues.push({ path: [setup.mesh ? 'mesh' : 'grid'], message: setup.mesh ? 'No element of the mesh lies in a simulated domain: check the mesh’s coordinates against the section, or its groups.' : 'No cell of the grid lies in a simulated domain: check the grid’s extent against the section.' });
	else if (simulated * n > MAX_ENSEMBLE_VALUES) {
		issues.push({
			path: [many],
			message: `${n} ${many} of ${simulated.toLocaleString('en')} simulated ${what} are more values than an ensemble map holds (${MAX_ENSEMBLE_VALUES.toLocaleString('en')}): use fewer ${many}${setup.mesh ? '' : ' or larger cells'}.`
		});
	}
	if (issues.length) fail(issues);
	for (const p of provenance) if (p.index !== null) p.cells = counts[p.index];
	for (const p of provenance) if (p.index !== null && p.cells === 0) warnings.push(`No ${setup.mesh ? 'element of the mesh' : 'cell of the grid'} lies in ${p.name}.`);
	const grid: ProvenanceGrid | null = resolved!.grid ? ({ ...resolved!.grid, cells, simulated } as ProvenanceGrid) : null;
	const mesh = resolved!.mesh ? { ...resolved!.mesh, simulated } : undefined;
	return { targets, warnings, grid, mesh };
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
	const resolved = resolveTargets(projectId, site, z, provenance, inputs.length, setup, setup.realizations, issues, db);
	const recipe = engineRecipe(() => createRecipe({ seed: setup.seed, domains: inputs }, resolved.targets, { realizations: setup.realizations }), issues);
	return {
		recipe,
		provenance: {
			kind: 'sgs',
			zonation: { id: z.id, name: z.name },
			geometry: site.geometry,
			lengthUnit: site.lengthUnit,
			seed: setup.seed,
			realizations: setup.realizations,
			grid: resolved.grid,
			...(resolved.mesh ? { mesh: resolved.mesh } : {}),
			domains: provenance,
			warnings: resolved.warnings
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
	const resolved = resolveTargets(projectId, site, z, provenance, inputs.length, setup, setup.percentiles.length, issues, db);
	const recipe = engineRecipe(() => createUniformRecipe(setup.percentiles, inputs, resolved.targets), issues);
	return {
		recipe,
		provenance: {
			kind: 'uniform',
			zonation: { id: z.id, name: z.name },
			geometry: site.geometry,
			lengthUnit: site.lengthUnit,
			seed: null,
			realizations: setup.percentiles.length,
			percentiles: setup.percentiles,
			grid: resolved.grid,
			...(resolved.mesh ? { mesh: resolved.mesh } : {}),
			domains: provenance,
			warnings: resolved.warnings
		}
	};
}

interface ResolvedTargets {
	targets: TargetDefinition;
	domain: Int32Array;
	warnings: string[];
	grid: (GridSpec & { counts: { x: number; y: number; z: number }; zEdges?: number[] }) | null;
	mesh: Omit<ProvenanceMesh, 'simulated'> | null;
}

/**
 * A grid setup's targets: the engine's regular grid, or with variable cell heights a rectilinear grid whose
 * elevation cells follow the units (unitHeightBands over the grid's columns) or the bands given (elevationCells).
 */
function gridTargets(strat: GridStratigraphy, members: Member[][], spec: GridSetup): ResolvedTargets {
	const heights = spec.elevation.heights;
	if (!heights) {
		const { grid, domain, warnings } = gridDomains(strat, members, spec);
		return { targets: { kind: 'grid', ...grid, domainRuns: domainRuns(domain) }, domain, warnings, grid: { ...spec, counts: grid.counts }, mesh: null };
	}
	const def = gridDefinition(spec);
	const xs = Array.from({ length: def.counts.x }, (_, i) => def.origin.x + i * def.spacing.x);
	const ys = Array.from({ length: def.counts.y }, (_, j) => def.origin.y + j * def.spacing.y);
	const { from, to, cell } = spec.elevation;
	let bands: HeightBand[];
	if ('byUnit' in heights) {
		const columns = ys.flatMap((y) => xs.map((x) => ({ x, y })));
		bands = unitHeightBands(strat, spec.geometry, columns, heights.byUnit, from);
	} else bands = heights.bands.map((b) => ({ bottom: b.from, top: b.to, cell: b.cell }));
	const { edges, centres } = elevationCells(from, to, cell, bands);
	// Counted before the domains are read, so a grid too large is refused without the work.
	if (xs.length * ys.length * centres.length > MAX_CELLS) {
		throw new InvalidInput(`The grid has ${(xs.length * ys.length * centres.length).toLocaleString('en')} cells; at most ${MAX_CELLS.toLocaleString('en')} are allowed. Use larger cells or a smaller extent.`, [
			{ path: ['grid'], message: `The grid has ${(xs.length * ys.length * centres.length).toLocaleString('en')} cells; at most ${MAX_CELLS.toLocaleString('en')} are allowed. Use larger cells or a smaller extent.` }
		]);
	}
	const { domain, warnings } = axesDomains(strat, members, spec.geometry, xs, ys, centres);
	return {
		targets: { kind: 'rectilinear', x: xs, y: ys, z: centres, domainRuns: domainRuns(domain) },
		domain,
		warnings,
		grid: { ...spec, counts: { x: xs.length, y: ys.length, z: centres.length }, zEdges: edges },
		mesh: null
	};
}

/** A mesh setup's targets: the mesh's centroids as points, each in the domain of the stratigraphy there or of its group. */
function meshTargets(
	projectId: string,
	geometry: '2d' | '3d',
	setup: MeshTargetSetup,
	members: Member[][],
	zonationDomains: ZonationView['domains'],
	provenance: ProvenanceDomain[],
	db: DbOrTx
): ResolvedTargets {
	const mesh = getMesh(projectId, setup.meshId, db);
	if (mesh.geometry !== geometry) throw new InvalidInput(`The mesh is ${mesh.geometry.toUpperCase()}; the site is ${geometry.toUpperCase()}.`, [{ path: ['mesh', 'meshId'], message: `The mesh is ${mesh.geometry.toUpperCase()}; the site is ${geometry.toUpperCase()}.` }]);
	const cols = meshColumns(projectId, setup.meshId, db);
	let domain: Int32Array;
	let warnings: string[];
	let groups: { group: string; domain: string | null }[] | undefined;
	if (setup.assign === 'stratigraphy') {
		({ domain, warnings } = pointDomains(projectStratigraphy(projectId, db), members, geometry, cols));
	} else {
		if (!cols.group) throw new InvalidInput('The mesh has no group column; assign its elements from the stratigraphy.', [{ path: ['mesh', 'assign'], message: 'The mesh has no group column; assign its elements from the stratigraphy.' }]);
		const index = new Map<string, number>();
		const issues: InputIssue[] = [];
		groups = [];
		setup.groups.forEach((g, k) => {
			if (!mesh.groups.some((mg) => mg.name === g.group)) issues.push({ path: ['mesh', 'groups', k, 'group'], message: `The mesh has no group ${g.group}.` });
			if (g.domainId === null) {
				index.set(g.group, -1);
				groups!.push({ group: g.group, domain: null });
				return;
			}
			const zd = zonationDomains.find((d) => d.id === g.domainId);
			const p = provenance.find((pd) => pd.domainId === g.domainId);
			if (!zd || !p) issues.push({ path: ['mesh', 'groups', k, 'domainId'], message: `That domain is not in the zonation.` });
			else {
				index.set(g.group, p.index ?? -1);
				groups!.push({ group: g.group, domain: zd.name });
			}
		});
		for (const mg of mesh.groups) if (!index.has(mg.name)) issues.push({ path: ['mesh', 'groups'], message: `Say which domain group ${mg.name} is in (or none).` });
		if (issues.length) throw new InvalidInput(issues.map((i) => i.message).join(' '), issues);
		domain = Int32Array.from(cols.group, (g) => index.get(g) ?? -1);
		warnings = [];
	}
	const y = geometry === '2d' ? new Array<number>(cols.x.length).fill(0) : Array.from(cols.y);
	return {
		targets: { kind: 'points', x: Array.from(cols.x), y, z: Array.from(cols.z), domain: Array.from(domain) },
		domain,
		warnings,
		grid: null,
		mesh: { id: mesh.id, name: mesh.name, elements: mesh.elements, assign: setup.assign, ...(groups ? { groups } : {}) }
	};
}
