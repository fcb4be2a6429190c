import type { ProjectApi, RecipeSummaryView, RecipeView, SectionView, ZonationView, ZoneBoundaryView } from '$lib/api';
import type { EnsembleStat } from '$lib/ensemble';
import { weightedQuantiles, type Recipe } from '$lib/geostat';
import { expandRuns } from '$lib/plots/raster';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import type { GridDefinition } from '$lib/site';
import { boundaryChoices, WeakZoneStudy } from '../weak-zones.svelte';
import { boundariesWhereZonationsDiffer, difference, domainFigures, gridRefusal, symmetricSpan, type DomainFigures } from './compare';

/** Most recipes compared at once. */
export const MAX_COMPARED = 3;

/** A recipe on the page: its view, its engine recipe, each cell's domain and the ensemble maps fetched so far. */
export interface Compared {
	id: string;
	name: string;
	view: RecipeView;
	recipe: Recipe;
	domainOf: Int32Array;
	maps: Partial<Record<EnsembleStat, Float64Array>>;
}

/** Which map the recipes show on one colour scale. */
export type CompareMap = 'mean' | 'sd' | 'below';

export const COMPARE_MAP_LABELS: Record<CompareMap, string> = { mean: 'E-type (mean)', sd: 'Standard deviation', below: 'P(below)' };

const toFloat = (values: (number | null)[]) => Float64Array.from(values, (v) => (v === null ? NaN : v));

/**
 * The Compare page: two or three recipes of one grid side by side — their E-type, standard deviation or
 * P(value < threshold) on one colour scale, the difference of two E-types on a diverging scale centred on zero,
 * each domain's figures in one table, a profile at a clicked chainage with each recipe's P10–P90 band and median,
 * the zone boundaries where their zonations split a unit differently, and their weak-zone figures. Ensemble maps
 * come from the server's summary endpoint (regenerated on its worker pool once, then cached); recipes on
 * different grids are refused with the reason.
 */
export class RecipeComparison {
	all = $state.raw<RecipeSummaryView[]>([]);
	chosen = $state<string[]>([]);
	items = $state.raw<Compared[]>([]);
	property = $state<SimulatedProperty>('qc1Ncs');
	map = $state<CompareMap>('mean');
	threshold = $state('');
	/** The difference shown: items[pair[1]] − items[pair[0]]. */
	pair = $state<[number, number]>([0, 1]);
	/** Grid column of the profile, or null. */
	column = $state<number | null>(null);
	exaggeration = $state(10);
	refusal = $state<string | null>(null);
	status = $state('');
	problem = $state('');
	loading = $state(true);
	weak = $state.raw<WeakZoneStudy | null>(null);
	section = $state.raw<SectionView | null>(null);
	/** Bumped when a map arrives. */
	private version = $state(0);
	private zonations: ZonationView[] = [];
	private boundaries: ZoneBoundaryView[] = [];
	private units: Awaited<ReturnType<ProjectApi['units']>> = [];
	private loaded = 0;

	constructor(
		private readonly api: ProjectApi,
		readonly lengthUnit: 'm' | 'ft',
		private readonly onChosen: (ids: string[]) => void = () => {}
	) {}

	/** Loads the project's recipes and what the maps draw; compares `wanted` (or the two newest). */
	async start(wanted: string[]): Promise<void> {
		try {
			const [all, zonations, boundaries, units] = await Promise.all([this.api.recipes(), this.api.zonations(), this.api.zoneBoundaries(), this.api.units()]);
			this.all = all;
			this.zonations = zonations;
			this.boundaries = boundaries;
			this.units = units;
			const ids = wanted.filter((id) => all.some((r) => r.id === id));
			for (const r of all) if (ids.length < 2 && !ids.includes(r.id)) ids.push(r.id);
			await this.choose(ids.slice(0, MAX_COMPARED));
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.loading = false;
		}
	}

	/** Adds or removes a recipe (two to three are compared). */
	async toggle(id: string): Promise<void> {
		const next = this.chosen.includes(id) ? this.chosen.filter((x) => x !== id) : [...this.chosen, id];
		if (next.length > MAX_COMPARED) {
			this.problem = `Compare at most ${MAX_COMPARED} recipes at once.`;
			return;
		}
		await this.choose(next);
	}

	/** Compares these recipes: their views and engine recipes, then (on one grid) their ensemble maps. */
	async choose(ids: string[]): Promise<void> {
		const ticket = ++this.loaded;
		this.chosen = ids;
		this.onChosen(ids);
		this.problem = '';
		this.refusal = null;
		this.column = null;
		this.pair = [0, 1];
		if (ids.length < 2) {
			this.items = [];
			this.weak = null;
			this.status = 'Choose two or three recipes to compare.';
			return;
		}
		this.status = 'Reading the recipes…';
		try {
			const items = await Promise.all(
				ids.map(async (id): Promise<Compared> => {
					const [view, recipe] = await Promise.all([this.api.recipe(id), this.api.recipeDocument(id)]);
					const domainOf = recipe.targets.kind === 'grid' ? expandRuns(recipe.targets.domainRuns) : new Int32Array(0);
					return { id, name: view.name, view, recipe, domainOf, maps: {} };
				})
			);
			if (ticket !== this.loaded) return;
			this.refusal = gridRefusal(items, this.lengthUnit);
			this.items = items;
			if (this.refusal) {
				this.status = '';
				this.weak = null;
				return;
			}
			const props = this.properties;
			if (!props.includes(this.property)) this.property = props[0];
			this.section ??= await this.api.section(this.property);
			this.weak = new WeakZoneStudy(this.api, ids, props, boundaryChoices(this.boundaries, this.units, this.lengthUnit), this.lengthUnit, Object.fromEntries(items.map((it) => [it.id, it.view.provenance.percentiles])));
			await this.fetchMaps(['mean', 'sd', 'p10', 'p50', 'p90'], ticket);
			if (this.threshold.trim() !== '') await this.fetchBelow(ticket);
		} catch (err) {
			if (ticket === this.loaded) this.problem = (err as Error).message;
		}
	}

	/** The ensemble maps of each recipe, one recipe after the other (the server keeps one ensemble in memory). */
	private async fetchMaps(stats: EnsembleStat[], ticket: number, threshold?: number): Promise<void> {
		for (const [k, item] of this.items.entries()) {
			const missing = stats.filter((s) => !item.maps[s]);
			if (missing.length === 0) continue;
			this.status = `Ensemble maps of ${item.name} (${k + 1} of ${this.items.length}); the first time the server regenerates its ${item.view.realizations} realizations…`;
			const got = await Promise.all(missing.map((s) => this.api.summary(item.id, s, s === 'below' ? threshold : undefined)));
			if (ticket !== this.loaded) return;
			missing.forEach((s, i) => (item.maps[s] = toFloat(got[i].values)));
			this.version++;
		}
		this.status = '';
	}

	private async fetchBelow(ticket: number): Promise<void> {
		const t = Number(this.threshold);
		if (!Number.isFinite(t)) {
			this.problem = 'The threshold must be a number.';
			return;
		}
		for (const item of this.items) delete item.maps.below;
		await this.fetchMaps(['below'], ticket, t);
	}

	/** Sets P(below)'s threshold and fetches the maps. */
	async setThreshold(text: string): Promise<void> {
		this.threshold = text;
		this.problem = '';
		if (text.trim() === '' || this.refusal) return;
		try {
			await this.fetchBelow(this.loaded);
		} catch (err) {
			this.problem = (err as Error).message;
		}
	}

	/** The properties any compared recipe simulates, the one with most cells first. */
	get properties(): SimulatedProperty[] {
		const cells = new Map<SimulatedProperty, number>();
		for (const it of this.items) for (const d of it.view.provenance.domains) if (d.index !== null) cells.set(d.property, (cells.get(d.property) ?? 0) + d.cells);
		return [...cells.keys()].sort((a, b) => (cells.get(b) ?? 0) - (cells.get(a) ?? 0));
	}

	readonly grid = $derived.by((): GridDefinition | null => {
		const t = this.items[0]?.recipe.targets;
		return t && t.kind === 'grid' && !this.refusal ? { origin: t.origin, spacing: t.spacing, counts: t.counts } : null;
	});

	/** Whether cell c of item k lies in a domain of the chosen property. */
	inProperty(k: number, c: number): boolean {
		const it = this.items[k];
		const d = it.domainOf[c];
		if (d < 0) return false;
		return it.view.provenance.domains.some((p) => p.index === d && p.property === this.property);
	}

	/** The map on show of item k, or null while it is not in. */
	values(k: number): Float64Array | null {
		void this.version;
		return this.items[k]?.maps[this.map] ?? null;
	}

	/** One colour scale for all: the 1st–99th percentile of the property's data (E-type), [0, max] (SD), [0, 1] (P(below)). */
	readonly span = $derived.by((): [number, number] => {
		void this.version;
		if (this.map === 'below') return [0, 1];
		if (this.map === 'sd') {
			let hi = 0;
			this.items.forEach((it, k) => {
				const v = it.maps.sd;
				if (v) for (let c = 0; c < v.length; c++) if (this.inProperty(k, c) && v[c] > hi) hi = v[c];
			});
			return [0, hi > 0 ? hi : 1];
		}
		const data: number[] = [];
		for (const it of this.items)
			it.recipe.input.domains.forEach((d, k) => {
				if (it.view.provenance.domains.some((p) => p.index === k && p.property === this.property)) for (const s of d.samples) data.push(s.value);
			});
		if (data.length === 0) return [0, 1];
		const [lo, hi] = weightedQuantiles(data, undefined, [0.01, 0.99]);
		return hi > lo ? [lo, hi] : [lo - 1, hi + 1];
	});

	/** E-type of items[pair[1]] minus that of items[pair[0]], or null while either is missing. */
	readonly difference = $derived.by((): Float64Array | null => {
		void this.version;
		const [a, b] = this.pair.map((k) => this.items[k]?.maps.mean);
		return a && b ? difference(a, b) : null;
	});

	/** Half the diverging scale: the largest |difference| in cells of the property in both recipes. */
	readonly differenceSpan = $derived.by(() => {
		const d = this.difference;
		return d ? symmetricSpan(d, (c) => this.inProperty(this.pair[0], c) && this.inProperty(this.pair[1], c)) : 1;
	});

	/** Zone boundaries of units the compared zonations split differently. */
	readonly differingBoundaries = $derived(
		boundariesWhereZonationsDiffer(
			this.items.map((it) => this.zonations.find((z) => z.id === it.view.zonationId)),
			this.boundaries
		)
	);

	/** Each recipe's domains over its maps. */
	readonly figures = $derived.by((): DomainFigures[][] => {
		void this.version;
		return this.items.map((it) => (it.maps.mean && it.maps.sd ? domainFigures(it.recipe, it.domainOf, { mean: it.maps.mean, sd: it.maps.sd, below: it.maps.below ?? null }) : []));
	});

	readonly unitText = $derived(PROPERTY_INFO[this.property].unit === '–' ? '' : PROPERTY_INFO[this.property].unit);
}
