import type { ProjectApi, UnitView, WeakZonesJson, ZoneBoundaryView } from '$lib/api';
import { largestExtentQuantiles } from '$lib/ensemble';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';

/** A zone boundary to test crossings against, named for the select list. */
export interface BoundaryChoice {
	id: string;
	label: string;
	line: ZoneBoundaryView;
}

/** The project's zone boundaries as choices: "Point-bar sand at ch. 205 m". */
export function boundaryChoices(boundaries: ZoneBoundaryView[], units: UnitView[], lengthUnit: string): BoundaryChoice[] {
	const name = new Map(units.map((u) => [u.id, u.name]));
	return boundaries.map((b) => {
		const at = b.chainageTop === b.chainageBottom ? `ch. ${b.chainageTop} ${lengthUnit}` : `ch. ${b.chainageTop}–${b.chainageBottom} ${lengthUnit}`;
		return { id: b.id, label: `${name.get(b.unitId) ?? 'Unit'} boundary at ${at}`, line: b };
	});
}

/** One recipe's weak-zone figures in the form a table shows them. */
export interface WeakZoneFigures {
	realizations: number;
	extent: { p10: number; p50: number; p90: number };
	/** Median over the realizations. */
	zones: number;
	area: number;
	crossing: number | null;
	crossings: number;
	/** The probability map, NaN where the property is not simulated. */
	map: Float64Array;
	/**
	 * A uniform baseline's figures field by field, one a percentile (its realizations are not a sample of a
	 * distribution, so P10/P50/P90 over them would mislead); absent for a stochastic recipe.
	 */
	byPercentile?: { percentile: number; extent: number; zones: number; area: number; crosses: boolean | null }[];
}

const median = (v: number[]) => {
	const s = [...v].sort((a, b) => a - b);
	const n = s.length;
	return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
};

/**
 * Weak-zone continuity of one or more recipes (GET …/weak-zones on the server, which regenerates the realizations
 * on its worker pool and caches the result): the property, the threshold below which a cell is weak, the least
 * length L of the zones the probability map counts, and the zone boundary crossings are tested against. A
 * screening measure of lateral continuity, not a liquefaction triggering or deformation analysis.
 */
export class WeakZoneStudy {
	property = $state<SimulatedProperty>('qc1Ncs');
	threshold = $state('');
	minLength = $state('');
	boundaryId = $state('');
	results = $state.raw<Record<string, WeakZoneFigures>>({});
	running = $state(false);
	/** Seconds since the request went out (the first computation regenerates every realization). */
	elapsed = $state(0);
	problem = $state('');

	constructor(
		private readonly api: ProjectApi,
		readonly recipeIds: string[],
		readonly properties: SimulatedProperty[],
		readonly boundaries: BoundaryChoice[],
		lengthUnit: 'm' | 'ft',
		/** The percentiles of the uniform baselines among the recipes, by recipe id. */
		private readonly percentiles: Record<string, number[] | undefined> = {}
	) {
		this.property = properties.includes('qc1Ncs') ? 'qc1Ncs' : properties[0];
		// A round screening figure for clean sands as the example puts it; others start empty.
		this.threshold = this.property === 'qc1Ncs' ? '100' : '';
		this.minLength = lengthUnit === 'ft' ? '60' : '20';
		this.boundaryId = boundaries[0]?.id ?? '';
	}

	readonly unit = $derived(PROPERTY_INFO[this.property].unit === '–' ? '' : PROPERTY_INFO[this.property].unit);

	/** What is wrong with the inputs, or '' when they can be sent. */
	readonly inputProblem = $derived.by(() => {
		const t = Number(this.threshold);
		if (this.threshold.trim() === '' || !Number.isFinite(t)) return `Type the threshold of ${PROPERTY_INFO[this.property].label} below which a cell is weak.`;
		const l = this.minLength.trim() === '' ? 0 : Number(this.minLength);
		if (!Number.isFinite(l) || l < 0) return 'The least length is a number ≥ 0.';
		return '';
	});

	/** Asks the server for every recipe's figures, one after the other (the server works on one at a time). */
	async run(): Promise<void> {
		if (this.inputProblem) {
			this.problem = this.inputProblem;
			return;
		}
		this.running = true;
		this.problem = '';
		this.elapsed = 0;
		const started = Date.now();
		const timer = setInterval(() => (this.elapsed = Math.round((Date.now() - started) / 1000)), 1000);
		const query = { property: this.property, threshold: Number(this.threshold), minLength: this.minLength.trim() === '' ? 0 : Number(this.minLength), boundary: this.boundaryId || null };
		const out: Record<string, WeakZoneFigures> = {};
		try {
			for (const id of this.recipeIds) out[id] = figuresOf(await this.api.weakZones(id, query), this.percentiles[id]);
			this.results = out;
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			clearInterval(timer);
			this.running = false;
		}
	}
}

/** The table's figures of one weak-zones answer; with `percentiles` (a uniform baseline's) also field by field. */
export function figuresOf(w: WeakZonesJson, percentiles?: number[]): WeakZoneFigures {
	const r = w.realizations;
	const byPercentile =
		percentiles && percentiles.length === r.length
			? r.map((x, k) => ({ percentile: percentiles[k], extent: x.largestExtent, zones: x.zones, area: x.largestArea, crosses: x.crossesBoundary }))
			: undefined;
	return {
		...(byPercentile ? { byPercentile } : {}),
		realizations: r.length,
		extent: largestExtentQuantiles(r),
		zones: median(r.map((x) => x.zones)),
		area: median(r.map((x) => x.largestArea)),
		crossing: w.crossingProbability,
		crossings: r.filter((x) => x.crossesBoundary).length,
		map: Float64Array.from(w.probabilityMap, (v) => (v === null ? NaN : v))
	};
}
