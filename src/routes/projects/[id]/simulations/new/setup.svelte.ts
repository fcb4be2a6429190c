import { RequestFailed, type ApiIssue, type MeshView, type ProjectApi, type RecipeView, type SectionView, type SiteView, type SoundingSummary, type VariogramView, type ZonationView } from '$lib/api';
import { DEFAULT_PERCENTILES, DEFAULT_SEARCH, MAX_CELLS, type RecipeSetupInput } from '$lib/schemas/recipe';
import { uniformValues, type PathOrder } from '$lib/geostat';
import {
	axesDomains,
	cellsPerDomain,
	elevationCells,
	gridDefinition,
	gridDomains,
	gridStratigraphy,
	polylineLength,
	unitHeightBands,
	type GridDefinition,
	type GridSpec,
	type GridStratigraphy,
	type HeightBand
} from '$lib/site';

/** One domain's row of the form; numbers as typed (empty: the default). */
export interface DomainRow {
	domainId: string;
	name: string;
	property: ZonationView['domains'][number]['property'];
	simulate: boolean;
	/** '' for the newest saved version. */
	variogramId: string;
	kriging: 'simple' | 'ordinary';
	maxData: string;
	maxSimulated: string;
	maxPerSounding: string;
	path: PathOrder;
	radiusMajor: string;
	radiusMinor: string;
	radiusVertical: string;
	zmin: string;
	zmax: string;
	/** Saved versions, newest first, and the data's extremes (for the stated defaults). */
	variograms: VariogramView[];
	dataMin: number | null;
	dataMax: number | null;
	samples: number;
	/** The conditioning data and their declustering weights (for a uniform recipe's values). */
	data: { values: number[]; weights: number[] };
}

/** What a recipe makes: N conditional realizations (SGS), or uniform fields at percentiles of each domain's data. */
export type SetupKind = 'sgs' | 'uniform';

/** Percentiles as typed ("33, 50, 67"): the numbers, or null when one is not a number. */
export function parsePercentiles(text: string): number[] | null {
	const parts = text.split(/[\s,;]+/).filter((t) => t !== '');
	if (parts.length === 0) return null;
	const ps = parts.map(Number);
	return ps.every((p) => Number.isFinite(p)) ? ps : null;
}

/** The grid as typed: from, to and cell size per axis. */
export interface GridFields {
	chainage: { from: string; to: string; cell: string };
	x: { from: string; to: string; cell: string };
	y: { from: string; to: string; cell: string };
	elevation: { from: string; to: string; cell: string };
}

const num = (t: string): number | null => (t.trim() === '' ? null : Number(t));

/** How cell heights are set along the elevation: one height, per unit, or per elevation band. */
export type HeightsMode = 'uniform' | 'units' | 'bands';

/** A unit's cell height as typed ('' for the grid's own height). */
export interface UnitHeightRow {
	unitId: string;
	name: string;
	cell: string;
}

/** An elevation band as typed. */
export interface BandRow {
	from: string;
	to: string;
	cell: string;
}

/** A fresh seed: nine random digits (shown and editable; any text will do). */
export function freshSeed(random: () => number = Math.random): string {
	return String(Math.floor(random() * 9e8) + 1e8);
}

/** A round cell size near span/n: 1, 2, 2.5 or 5 × 10ᵏ. */
function niceCell(span: number, n: number): number {
	const raw = span / n;
	const k = Math.floor(Math.log10(raw));
	const base = 10 ** k;
	const m = raw / base;
	const step = m >= 5 ? 5 : m >= 2.5 ? 2.5 : m >= 2 ? 2 : 1;
	return Number((step * base).toPrecision(6));
}

/**
 * The recipe setup form: zonation, seed, N, the target grid, and per domain its saved variogram version,
 * kriging, search and tail bounds, or "not simulated". The grid's cells are assigned to domains in the browser
 * by the same function the server uses (gridDomains over gridStratigraphy), so the preview is the grid the
 * recipe will hold. Create sends the setup to the API; the same inputs as an existing recipe open that one.
 */
export class RecipeSetupForm {
	kind = $state<SetupKind>('sgs');
	/** A uniform recipe's percentiles as typed. */
	percentiles = $state(DEFAULT_PERCENTILES.join(', '));
	name = $state('');
	zonationId = $state('');
	seed = $state(freshSeed());
	realizations = $state('20');
	grid = $state<GridFields>({
		chainage: { from: '', to: '', cell: '' },
		x: { from: '', to: '', cell: '' },
		y: { from: '', to: '', cell: '' },
		elevation: { from: '', to: '', cell: '' }
	});
	rows = $state<DomainRow[]>([]);
	/** What the realizations are made at: a grid over the site, or an uploaded mesh's elements. */
	target = $state<'grid' | 'mesh'>('grid');
	heightsMode = $state<HeightsMode>('uniform');
	unitHeights = $state<UnitHeightRow[]>([]);
	bands = $state<BandRow[]>([{ from: '', to: '', cell: '' }]);
	meshes = $state.raw<MeshView[]>([]);
	meshId = $state('');
	meshAssign = $state<'stratigraphy' | 'groups'>('stratigraphy');
	/** Each mesh group's domain: a domain id, or '' for not simulated. */
	groupDomains = $state<Record<string, string>>({});
	zonations = $state.raw<ZonationView[]>([]);
	site = $state.raw<SiteView | null>(null);
	section = $state.raw<SectionView | null>(null);
	strat = $state.raw<GridStratigraphy | null>(null);
	loading = $state(true);
	saving = $state(false);
	problem = $state('');
	issues = $state.raw<ApiIssue[]>([]);
	notice = $state('');

	private existing = new Set<string>();
	private soundings: SoundingSummary[] = [];

	constructor(
		private readonly api: ProjectApi,
		private readonly onCreated: (recipe: RecipeView, existed: boolean) => void
	) {}

	readonly geometry = $derived(this.site?.geometry ?? '2d');
	/** The percentiles typed, when they are numbers strictly between 0 and 100. */
	readonly percentileList = $derived.by(() => {
		const ps = parsePercentiles(this.percentiles);
		return ps && ps.every((p) => p > 0 && p < 100) ? ps : null;
	});

	/** A domain's value at each percentile typed (the engine's uniformValues, as the server will resolve it), or null. */
	uniformOf(row: DomainRow): number[] | null {
		if (!this.percentileList || row.data.values.length === 0) return null;
		return uniformValues(row.data.values, row.data.weights, this.percentileList);
	}

	/** Whether every simulated domain visits its nodes on a constant path (one for all realizations); false with none. */
	readonly constantPaths = $derived(this.rows.some((r) => r.simulate) && this.rows.every((r) => !r.simulate || r.path.endsWith('-constant')));

	/** Puts every domain on a constant path, or back on a path per realization, keeping each one's order (random or coarse grids first). */
	setConstantPaths(on: boolean): void {
		for (const r of this.rows) {
			const order = r.path.startsWith('multigrid') ? 'multigrid' : 'random';
			r.path = on ? `${order}-constant` : order;
		}
	}

	/** Switches the kind: domains are included by default when they have data (and, for SGS, a saved variogram). */
	setKind(kind: SetupKind): void {
		this.kind = kind;
		for (const r of this.rows) r.simulate = r.samples > 0 && (kind === 'uniform' || r.variograms.length > 0);
		const z = this.zonation;
		if (z && (!this.name || /(, \d+ realizations|, uniform P[\d., P]+)$/.test(this.name))) this.name = this.defaultName(z.name);
	}

	private defaultName(zonation: string): string {
		return this.kind === 'uniform' ? `${zonation}, uniform P${(this.percentileList ?? DEFAULT_PERCENTILES).join(', P')}` : `${zonation}, ${this.realizations} realizations`;
	}
	readonly zonation = $derived(this.zonations.find((z) => z.id === this.zonationId) ?? null);

	/** The grid spec as typed, or null while a number is missing or not a number. */
	readonly spec = $derived.by((): GridSpec | null => {
		const axis = (a: { from: string; to: string; cell: string }) => {
			const from = num(a.from);
			const to = num(a.to);
			const cell = num(a.cell);
			return from === null || to === null || cell === null || !Number.isFinite(from + to + cell) || !(to > from) || !(cell > 0) ? null : { from, to, cell };
		};
		const e = axis(this.grid.elevation);
		if (this.geometry === '2d') {
			const c = axis(this.grid.chainage);
			return c && e ? { geometry: '2d', chainage: c, elevation: e } : null;
		}
		const x = axis(this.grid.x);
		const y = axis(this.grid.y);
		return x && y && e ? { geometry: '3d', x, y, elevation: e } : null;
	});

	/** The height bands typed (per unit or per elevation band), or null for one height; [] while a number is missing. */
	readonly heightBands = $derived.by((): HeightBand[] | null => {
		if (this.heightsMode === 'uniform' || !this.spec || !this.strat) return null;
		if (this.heightsMode === 'bands') {
			return this.bands.flatMap((b) => {
				const [from, to, cell] = [num(b.from), num(b.to), num(b.cell)];
				return from !== null && to !== null && cell !== null && to > from && cell > 0 ? [{ bottom: from, top: to, cell }] : [];
			});
		}
		const def = gridDefinition(this.spec);
		const columns: { x: number; y: number }[] = [];
		for (let j = 0; j < def.counts.y; j++) for (let i = 0; i < def.counts.x; i++) columns.push({ x: def.origin.x + i * def.spacing.x, y: def.origin.y + j * def.spacing.y });
		const heights = this.unitHeights.flatMap((u) => (num(u.cell) !== null && num(u.cell)! > 0 ? [{ unitId: u.unitId, cell: num(u.cell)! }] : []));
		return unitHeightBands(this.strat, this.geometry, columns, heights, this.spec.elevation.from);
	});

	/** The grid with each cell's domain (index into the simulated rows), computed as the server will. */
	readonly preview = $derived.by(() => {
		if (this.target !== 'grid' || !this.spec || !this.strat || !this.zonation) return null;
		const def = gridDefinition(this.spec);
		let grid: GridDefinition = def;
		if (this.heightBands) {
			const { edges, centres } = elevationCells(this.spec.elevation.from, this.spec.elevation.to, this.spec.elevation.cell, this.heightBands);
			grid = { ...def, counts: { ...def.counts, z: centres.length }, z: centres, zEdges: edges };
		}
		const cells = grid.counts.x * grid.counts.y * grid.counts.z;
		if (cells > MAX_CELLS) return { tooBig: cells } as const;
		const simulated = this.rows.filter((r) => r.simulate);
		const members = simulated.map((r) => this.zonation!.domains.find((d) => d.id === r.domainId)!.members);
		const result = grid.z
			? {
					grid,
					...axesDomains(
						this.strat,
						members,
						this.geometry,
						Array.from({ length: grid.counts.x }, (_, i) => def.origin.x + i * def.spacing.x),
						Array.from({ length: grid.counts.y }, (_, j) => def.origin.y + j * def.spacing.y),
						grid.z
					)
				}
			: gridDomains(this.strat, members, this.spec);
		return { ...result, names: simulated.map((r) => r.name), counts: cellsPerDomain(result.domain, simulated.length), tooBig: null };
	});

	/** The mesh chosen, if any. */
	readonly mesh = $derived(this.meshes.find((m) => m.id === this.meshId) ?? null);

	/** Loads zonations, site, soundings and stratigraphy; prefills from an existing recipe when `from` is given. */
	async start(from: string | null): Promise<void> {
		try {
			const [zonations, site, soundings, units, contacts, boundaries, recipes, meshes] = await Promise.all([
				this.api.zonations(),
				this.api.site(),
				this.api.soundings(),
				this.api.units(),
				this.api.contacts(),
				this.api.zoneBoundaries(),
				this.api.recipes(),
				this.api.meshes()
			]);
			this.meshes = meshes;
			this.meshId = meshes[0]?.id ?? '';
			this.unitHeights = units.map((u) => ({ unitId: u.id, name: u.name, cell: '' }));
			this.zonations = zonations;
			this.site = site;
			this.soundings = soundings;
			this.existing = new Set(recipes.map((r) => r.id));
			this.strat = gridStratigraphy({ sectionLine: site.sectionLine, soundings, units, contacts, boundaries });
			this.defaultGrid();
			const base = from ? await this.api.recipe(from) : null;
			const z = base ? zonations.find((zz) => zz.id === base.zonationId) : zonations.find((zz) => zz.domains.length > 0);
			if (z) await this.selectZonation(z.id);
			if (base) this.prefill(base);
			if (z) this.section = await this.api.section(z.domains[0]?.property ?? 'qc1Ncs');
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.loading = false;
		}
	}

	/** The site's extent: along the section line (or the soundings' chainages) and from their deepest reading to the highest ground. */
	defaultGrid(): void {
		const s = this.soundings;
		if (s.length === 0 || !this.site) return;
		const top = Math.ceil(Math.max(...s.map((x) => x.groundElevation)));
		const bottom = Math.floor(Math.min(...s.map((x) => x.groundElevation - x.maxDepth)));
		const heights = this.zonation?.domains.map((d) => d.cellHeight).filter((h): h is number => h !== null && h > 0) ?? [];
		const height = heights.length ? Math.min(...heights) : this.site.lengthUnit === 'ft' ? 1 : 0.25;
		this.grid.elevation = { from: String(bottom), to: String(top), cell: String(height) };
		if (this.site.geometry === '2d') {
			const cs = s.map((x) => x.chainage).filter((c): c is number => c !== null);
			const line = this.site.sectionLine;
			const from = line ? 0 : Math.floor(Math.min(...cs));
			const to = line ? Math.ceil(polylineLength(line)) : Math.ceil(Math.max(...cs));
			if (Number.isFinite(from) && Number.isFinite(to) && to > from) this.grid.chainage = { from: String(from), to: String(to), cell: String(niceCell(to - from, 400)) };
		} else {
			const xs = s.map((p) => p.x).filter((v): v is number => v !== null);
			const ys = s.map((p) => p.y).filter((v): v is number => v !== null);
			if (xs.length) {
				const [x0, x1, y0, y1] = [Math.floor(Math.min(...xs)), Math.ceil(Math.max(...xs)), Math.floor(Math.min(...ys)), Math.ceil(Math.max(...ys))];
				const cell = String(niceCell(Math.max(x1 - x0, y1 - y0, 1), 60));
				this.grid.x = { from: String(x0), to: String(Math.max(x1, x0 + 1)), cell };
				this.grid.y = { from: String(y0), to: String(Math.max(y1, y0 + 1)), cell };
			}
		}
	}

	/** Chooses a zonation: one row per domain, simulated with its newest variogram and the default settings. */
	async selectZonation(id: string): Promise<void> {
		this.zonationId = id;
		const z = this.zonations.find((zz) => zz.id === id);
		if (!z) return;
		if (!this.name) this.name = this.defaultName(z.name);
		const rows = await Promise.all(
			z.domains.map(async (d): Promise<DomainRow> => {
				const [variograms, samples] = await Promise.all([this.api.variograms(d.id), this.api.domainSamples(d.id)]);
				const values = samples.samples.value;
				return {
					domainId: d.id,
					name: d.name,
					property: d.property,
					simulate: values.length > 0 && (this.kind === 'uniform' || variograms.length > 0),
					variogramId: '',
					kriging: 'simple',
					maxData: String(DEFAULT_SEARCH.maxData),
					maxSimulated: String(DEFAULT_SEARCH.maxSimulated),
					maxPerSounding: String(DEFAULT_SEARCH.maxPerSounding),
					path: 'random',
					radiusMajor: '',
					radiusMinor: '',
					radiusVertical: '',
					zmin: '',
					zmax: '',
					variograms,
					dataMin: values.length ? Math.min(...values) : null,
					dataMax: values.length ? Math.max(...values) : null,
					samples: values.length,
					data: { values, weights: samples.weights }
				};
			})
		);
		if (this.zonationId === id) this.rows = rows;
		this.defaultGrid();
	}

	/** Takes over an existing recipe's setup (to change it into a new recipe). */
	prefill(base: RecipeView): void {
		const s = base.setup;
		this.name = `${base.name} (changed)`;
		this.kind = s.kind ?? 'sgs';
		if (s.kind === 'uniform') this.percentiles = s.percentiles.join(', ');
		else {
			this.seed = s.seed;
			this.realizations = String(s.realizations);
		}
		const text = (a: { from: number; to: number; cell: number }) => ({ from: String(a.from), to: String(a.to), cell: String(a.cell) });
		if (s.grid) {
			this.target = 'grid';
			if (s.grid.geometry === '2d') this.grid.chainage = text(s.grid.chainage);
			else {
				this.grid.x = text(s.grid.x);
				this.grid.y = text(s.grid.y);
			}
			this.grid.elevation = text(s.grid.elevation);
			const h = s.grid.elevation.heights;
			if (h && 'byUnit' in h) {
				this.heightsMode = 'units';
				for (const u of this.unitHeights) u.cell = String(h.byUnit.find((b) => b.unitId === u.unitId)?.cell ?? '');
			} else if (h) {
				this.heightsMode = 'bands';
				this.bands = h.bands.map((b) => ({ from: String(b.from), to: String(b.to), cell: String(b.cell) }));
			}
		}
		if (s.mesh) {
			this.target = 'mesh';
			this.meshId = s.mesh.meshId;
			this.meshAssign = s.mesh.assign;
			if (s.mesh.assign === 'groups') this.groupDomains = Object.fromEntries(s.mesh.groups.map((g) => [g.group, g.domainId ?? '']));
		}
		for (const row of this.rows) {
			const found = s.domains.find((x) => x.domainId === row.domainId);
			if (!found) continue;
			row.simulate = found.simulate;
			if (s.kind === 'uniform' || !found.simulate) continue;
			const d = found as Extract<(typeof s.domains)[number], { simulate: true; variogramId: string | null }>;
			row.variogramId = d.variogramId ?? '';
			row.kriging = d.kriging;
			row.maxData = String(d.search.maxData);
			row.maxSimulated = String(d.search.maxSimulated);
			row.maxPerSounding = d.search.maxPerSounding === null ? '' : String(d.search.maxPerSounding);
			row.path = d.search.path;
			row.radiusMajor = d.search.radius ? String(d.search.radius.major) : '';
			row.radiusMinor = d.search.radius ? String(d.search.radius.minor) : '';
			row.radiusVertical = d.search.radius ? String(d.search.radius.vertical) : '';
			row.zmin = d.tails.zmin === null ? '' : String(d.tails.zmin);
			row.zmax = d.tails.zmax === null ? '' : String(d.tails.zmax);
		}
	}

	/** The elevation axis as the API takes it, with the cell heights per unit or band when chosen. */
	private elevationBody() {
		const n = (t: string) => num(t) ?? NaN;
		const e = this.grid.elevation;
		const axis = { from: n(e.from), to: n(e.to), cell: n(e.cell) };
		if (this.heightsMode === 'units') {
			const byUnit = this.unitHeights.filter((u) => u.cell.trim() !== '').map((u) => ({ unitId: u.unitId, cell: n(u.cell) }));
			return byUnit.length ? { ...axis, heights: { byUnit } } : axis;
		}
		if (this.heightsMode === 'bands') return { ...axis, heights: { bands: this.bands.map((b) => ({ from: n(b.from), to: n(b.to), cell: n(b.cell) })) } };
		return axis;
	}

	/** The request body as the API takes it (numbers as typed; the server checks them). */
	body(): RecipeSetupInput {
		const n = (t: string) => num(t) ?? NaN;
		const axis = (a: { from: string; to: string; cell: string }) => ({ from: n(a.from), to: n(a.to), cell: n(a.cell) });
		const targets: Pick<RecipeSetupInput, 'grid' | 'mesh'> =
			this.target === 'mesh'
				? {
						mesh:
							this.meshAssign === 'groups'
								? { meshId: this.meshId, assign: 'groups', groups: (this.mesh?.groups ?? []).map((g) => ({ group: g.name, domainId: this.groupDomains[g.name] || null })) }
								: { meshId: this.meshId, assign: 'stratigraphy' }
					}
				: {
						grid:
							this.geometry === '2d'
								? { geometry: '2d', chainage: axis(this.grid.chainage), elevation: this.elevationBody() }
								: { geometry: '3d', x: axis(this.grid.x), y: axis(this.grid.y), elevation: this.elevationBody() }
					};
		if (this.kind === 'uniform') {
			return {
				kind: 'uniform',
				name: this.name,
				zonationId: this.zonationId,
				percentiles: parsePercentiles(this.percentiles) ?? [NaN],
				...targets,
				domains: this.rows.map((r) => ({ domainId: r.domainId, simulate: r.simulate }))
			};
		}
		return {
			kind: 'sgs',
			name: this.name,
			zonationId: this.zonationId,
			seed: this.seed,
			realizations: n(this.realizations),
			...targets,
			domains: this.rows.map((r) =>
				r.simulate
					? {
							domainId: r.domainId,
							simulate: true,
							variogramId: r.variogramId || null,
							kriging: r.kriging,
							search: {
								maxData: n(r.maxData),
								maxSimulated: n(r.maxSimulated),
								maxPerSounding: num(r.maxPerSounding),
								path: r.path,
								radius: r.radiusMajor || r.radiusMinor || r.radiusVertical ? { major: n(r.radiusMajor), minor: n(r.radiusMinor || r.radiusMajor), vertical: n(r.radiusVertical) } : null
							},
							tails: { zmin: num(r.zmin), zmax: num(r.zmax) }
						}
					: { domainId: r.domainId, simulate: false }
			)
		};
	}

	/** Issues the API raised about domain row k. */
	rowIssues(k: number): string[] {
		return this.issues.filter((i) => i.path[0] === 'domains' && i.path[1] === k).map((i) => i.message);
	}

	async create(): Promise<void> {
		this.saving = true;
		this.problem = '';
		this.issues = [];
		try {
			const recipe = await this.api.createRecipe(this.body());
			this.onCreated(recipe, this.existing.has(recipe.id));
		} catch (err) {
			this.problem = (err as Error).message;
			if (err instanceof RequestFailed) this.issues = err.issues;
		} finally {
			this.saving = false;
		}
	}
}
