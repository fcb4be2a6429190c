import type { RecipeView } from '$lib/api';
import { checkUniform, type CheckOptions, type DomainCheck, type EnsembleStat, type UniformCheck } from '$lib/ensemble';
import { weightedQuantiles, type Recipe } from '$lib/geostat';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import type { GridDefinition } from '$lib/site';
import { expandRuns } from '$lib/plots/raster';
import type { EnsembleRun } from './run.svelte';

/** Ensemble maps and checks off the page's thread (workers/ensemble.ts), or the same functions in process in tests. */
export interface EnsembleEngine {
	ensembleMap(realizations: Float64Array[], stat: EnsembleStat, threshold?: number): Promise<Float64Array>;
	checks(recipe: Recipe, realizations: Float64Array[], opts?: CheckOptions): Promise<DomainCheck[]>;
	terminate(): void;
}

/** What the field shows: one realization, or an ensemble map. */
export type FieldMode = 'realization' | EnsembleStat;

export const MODE_LABELS: Record<FieldMode, string> = {
	realization: 'Realization',
	mean: 'Mean (E-type)',
	sd: 'Standard deviation',
	p10: 'P10',
	p50: 'P50',
	p90: 'P90',
	below: 'P(below)'
};

/** A simulated domain of the recipe, by its index in the recipe. */
export interface RecipeDomain {
	index: number;
	name: string;
	property: SimulatedProperty;
	cells: number;
	/** The span realizations' values can take: the tail bounds in force (the data's extremes with a trend). */
	zmin: number;
	zmax: number;
}

/**
 * The Simulations viewer of one recipe: which field is shown (a realization or an ensemble map), for which
 * property (domains of other properties are greyed), the threshold of P(below), the cell under the cursor, the
 * chainage of the profile, and the checks. Ensemble maps are computed in the ensemble worker from all N
 * realizations in realization order, by the same function as the summary endpoint, so they have its bits.
 */
export class FieldViewer {
	mode = $state<FieldMode>('realization');
	realization = $state(0);
	threshold = $state<number | null>(null);
	property = $state<SimulatedProperty>('qc1Ncs');
	exaggeration = $state(10);
	/** Target under the cursor, −1 for none. */
	hover = $state(-1);
	/** Grid column (x index) of the profile, or null. */
	profileColumn = $state<number | null>(null);
	/** 3D: the plan slice's elevation row. */
	planRow = $state(0);
	mapStatus = $state('');
	checks = $state.raw<DomainCheck[] | null>(null);
	/** A uniform recipe's checks (its values against its data), instead of `checks`. */
	uniformChecks = $state.raw<UniformCheck[] | null>(null);
	checksStatus = $state('');
	/** Bumped when a map arrives. */
	private mapVersion = $state(0);

	readonly grid: GridDefinition;
	readonly domain: Int32Array;
	readonly domains: RecipeDomain[];
	readonly properties: SimulatedProperty[];
	private readonly maps = new Map<string, Float64Array>();

	constructor(
		readonly view: RecipeView,
		readonly recipe: Recipe,
		readonly run: EnsembleRun,
		private readonly engine: EnsembleEngine
	) {
		const t = recipe.targets;
		if (t.kind === 'points') throw new RangeError('the viewer draws grids');
		if (t.kind === 'grid') this.grid = { origin: t.origin, spacing: t.spacing, counts: t.counts };
		else {
			// A rectilinear grid of variable cell heights (uniform columns): its edges from the provenance.
			const step = (a: number[]) => (a.length > 1 ? a[1] - a[0] : 1);
			const zEdges = view.provenance.grid?.zEdges;
			let smallest = Infinity;
			for (let k = 1; k < t.z.length; k++) smallest = Math.min(smallest, t.z[k] - t.z[k - 1]);
			this.grid = {
				origin: { x: t.x[0], y: t.y[0], z: t.z[0] },
				spacing: { x: step(t.x), y: step(t.y), z: Number.isFinite(smallest) ? smallest : 1 },
				counts: { x: t.x.length, y: t.y.length, z: t.z.length },
				z: t.z,
				zEdges: zEdges ?? [t.z[0] - 0.5, ...t.z.map((z) => z + 0.5)]
			};
		}
		this.domain = expandRuns(t.domainRuns);
		this.domains = view.provenance.domains
			.filter((d) => d.index !== null)
			.sort((a, b) => a.index! - b.index!)
			.map((d) => {
				// With a trend the tail bounds are of the residuals, and a uniform recipe has none: the values' span is then the data's.
				const values = recipe.input.domains[d.index!].samples.map((s) => s.value);
				const [zmin, zmax] = d.trend || !d.tails ? [Math.min(...values), Math.max(...values)] : [d.tails.zmin, d.tails.zmax];
				return { index: d.index!, name: d.name, property: d.property, cells: d.cells, zmin, zmax };
			});
		this.properties = [...new Set(this.domains.map((d) => d.property))];
		// The property most of the grid is in comes first.
		const cells = new Map<SimulatedProperty, number>();
		for (const d of this.domains) cells.set(d.property, (cells.get(d.property) ?? 0) + d.cells);
		this.properties.sort((a, b) => (cells.get(b) ?? 0) - (cells.get(a) ?? 0));
		this.property = this.properties[0];
		this.planRow = Math.floor(this.grid.counts.z / 2);
		// A uniform baseline opens at its P50 when it has one.
		if (recipe.kind === 'uniform') this.realization = Math.max(0, recipe.input.percentiles.indexOf(50));
	}

	/** What realization r is called: "realization 3", or "P50" for a uniform recipe. */
	realizationName(r: number): string {
		return this.recipe.kind === 'uniform' ? `P${this.recipe.input.percentiles[r]}` : `realization ${r}`;
	}

	readonly info = $derived(PROPERTY_INFO[this.property]);
	/** "qc1Ncs" or "su (kPa)". */
	readonly unitText = $derived(this.info.unit === '–' ? '' : this.info.unit);

	/** The field on show, or null when it is not made yet. */
	readonly values = $derived.by((): Float64Array | null => {
		void this.run.version;
		void this.mapVersion;
		if (this.mode === 'realization') return this.run.results.get(this.realization) ?? null;
		return this.maps.get(this.mapKey(this.mode, this.threshold)) ?? null;
	});

	/**
	 * The span the colours of the property's values cover: the 1st to 99th percentile of its domains' conditioning
	 * data (a few extreme readings would otherwise wash out the rest); values beyond take the end colours.
	 */
	readonly valueSpan = $derived.by((): [number, number] => {
		const values: number[] = [];
		this.recipe.input.domains.forEach((d, k) => {
			if (this.domains[k]?.property === this.property) for (const s of d.samples) values.push(s.value);
		});
		if (values.length === 0) return [0, 1];
		const [lo, hi] = weightedQuantiles(values, undefined, [0.01, 0.99]);
		return hi > lo ? [lo, hi] : [lo - 1, hi + 1];
	});

	/** The span the property's values can take: the tail bounds of its domains (the data's extremes by default). */
	readonly tailSpan = $derived.by((): [number, number] => {
		const ds = this.domains.filter((d) => d.property === this.property);
		return [Math.min(...ds.map((d) => d.zmin)), Math.max(...ds.map((d) => d.zmax))];
	});

	/** The colour scale's span: the value span, [0, max] for SD, [0, 1] for P(below). */
	readonly span = $derived.by((): [number, number] => {
		if (this.mode === 'below') return [0, 1];
		if (this.mode === 'sd') {
			const v = this.values;
			let hi = 0;
			if (v) for (let i = 0; i < v.length; i++) if (this.propertyOf(i) === this.property && v[i] > hi) hi = v[i];
			return [0, hi > 0 ? hi : 1];
		}
		return this.valueSpan;
	});

	/** The colour bar's title with its unit. */
	readonly scaleLabel = $derived.by(() => {
		const { label } = this.info;
		const u = this.unitText ? ` (${this.unitText})` : '';
		if (this.mode === 'below') return `P(${label} < ${this.threshold ?? '…'}${this.unitText ? ` ${this.unitText}` : ''})`;
		if (this.mode === 'sd') return `Standard deviation of ${label}${u}`;
		if (this.mode === 'realization') return `${label}${u}, ${this.realizationName(this.realization)}`;
		return `${MODE_LABELS[this.mode]} of ${label}${u}`;
	});

	propertyOf(cell: number): SimulatedProperty | null {
		const d = this.domain[cell];
		return d >= 0 ? this.domains[d].property : null;
	}

	/** Shows realization r (wrapped into 0 … N − 1). */
	show(r: number): void {
		const n = this.run.n;
		this.realization = ((r % n) + n) % n;
		this.mode = 'realization';
	}

	/** Switches to an ensemble map, computing it when all N realizations are in. */
	async showMap(stat: EnsembleStat): Promise<void> {
		this.mode = stat;
		await this.ensureMap();
	}

	async setThreshold(t: number | null): Promise<void> {
		this.threshold = t;
		if (this.mode === 'below') await this.ensureMap();
	}

	/** Computes the map on show if it is missing and can be made. */
	async ensureMap(): Promise<void> {
		const stat = this.mode;
		if (stat === 'realization') return;
		if (stat === 'below' && (this.threshold === null || !Number.isFinite(this.threshold))) {
			this.mapStatus = `Type a threshold in ${this.unitText || 'the property’s unit'} to map the probability of lying below it.`;
			return;
		}
		const key = this.mapKey(stat, this.threshold);
		if (this.maps.has(key)) {
			this.mapStatus = '';
			return;
		}
		const all = this.run.all();
		if (!all) {
			this.mapStatus = `Ensemble maps need all ${this.run.n} realizations: run the rest first.`;
			return;
		}
		this.mapStatus = 'Computing the map…';
		const map = await this.engine.ensembleMap(all, stat, stat === 'below' ? this.threshold! : undefined);
		this.maps.set(key, map);
		this.mapVersion++;
		if (this.mode === stat) this.mapStatus = '';
	}

	/** The map already computed for a stat, if any (tests, the profile). */
	map(stat: EnsembleStat, threshold: number | null = null): Float64Array | undefined {
		void this.mapVersion;
		return this.maps.get(this.mapKey(stat, threshold));
	}

	/** Runs the checks on the realizations made so far (all N when the run is complete). */
	async runChecks(): Promise<void> {
		const made = [...this.run.results.keys()].sort((a, b) => a - b);
		if (made.length === 0) {
			this.checksStatus = 'Run realizations first.';
			return;
		}
		this.checksStatus = `Checking ${made.length} realization${made.length === 1 ? '' : 's'}…`;
		if (this.recipe.kind === 'uniform') {
			this.uniformChecks = checkUniform(this.recipe, this.run.results);
			this.checksStatus = '';
			return;
		}
		try {
			this.checks = await this.engine.checks(
				this.recipe,
				made.map((r) => this.run.results.get(r)!)
			);
			this.checksStatus = made.length < this.run.n ? `Checked ${made.length} of ${this.run.n} realizations.` : '';
		} catch (err) {
			this.checksStatus = (err as Error).message;
		}
	}

	private mapKey(stat: EnsembleStat, threshold: number | null): string {
		return stat === 'below' ? `below:${threshold}` : stat;
	}
}
