import { cellDeclusterWeights, weightedMean, weightedQuantiles, weightedVariance, type Sample } from '$lib/geostat';
import { getDb } from '$lib/server/db';
import type { Averaging } from '$lib/server/db/site-schema';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { deriveSoundings } from './derived';
import { getSite, type DbOrTx } from './site';
import { boundariesByUnit, zoneOf, type BoundaryLine } from './stratigraphy';
import { getDomain, WHOLE_UNIT } from './zonations';

export interface Cdf {
	value: number[];
	p: number[];
}

export interface DomainStats {
	n: number;
	mean: number;
	sd: number;
	p10: number;
	p50: number;
	p90: number;
}

/** The conditioning data of a domain, as GET …/domains/[did]/samples returns it (see the site-model contract). */
export interface DomainSamples {
	domain: {
		id: string;
		name: string;
		zonationId: string;
		zonationName: string;
		property: SimulatedProperty;
		cellHeight: number | null;
		averaging: Averaging;
		declusterCell: { x: number; y: number; z: number | null } | null;
	};
	property: { key: SimulatedProperty; label: string; unit: string };
	lengthUnit: 'm' | 'ft';
	geometry: '2d' | '3d';
	/** 2D: x = chainage, y = 0; 3D: x = easting, y = northing. z = elevation. */
	samples: { x: number[]; y: number[]; z: number[]; value: number[]; sounding: string[] };
	/** Declustering weights summing to 1 (equal when the domain sets no cell). */
	weights: number[];
	stats: DomainStats;
	soundings: { name: string; n: number; mean: number; cdf: Cdf }[];
	cdf: Cdf;
	/** Soundings left out and why (no chainage, no easting/northing …). */
	warnings: string[];
}

/** One sounding as the extraction needs it: readings' elevations, unit indices and property values. */
export interface ExtractSounding {
	name: string;
	/** Section chainage; needed in 2D and wherever a member unit is split into zones. */
	chainage: number | null;
	x: number | null;
	y: number | null;
	elevation: ArrayLike<number>;
	/** Index into `unitIds` of each reading's unit, −1 for none. */
	unit: ArrayLike<number>;
	value: ArrayLike<number>;
}

export interface ExtractOptions {
	geometry: '2d' | '3d';
	/** Unit id of each unit index used by ExtractSounding.unit. */
	unitIds: string[];
	members: { unitId: string; zone: number }[];
	/** Zone boundaries per unit id. */
	boundaries: Map<string, BoundaryLine[]>;
	cellHeight: number | null;
	averaging: Averaging;
}

/**
 * A domain's property samples: the readings of each sounding that fall in a member unit (and member zone,
 * by {@link zoneOf} at the reading's chainage and elevation) with a finite value, averaged to the cell height
 * when asked ({@link averageInWindows}). Readings with NaN values (e.g. where the correlation is undefined) are
 * left out. Soundings that cannot be placed are reported in `warnings`.
 */
export function extractDomainSamples(soundingList: ExtractSounding[], opts: ExtractOptions): { samples: Sample[]; warnings: string[] } {
	const { geometry, unitIds, members, boundaries, cellHeight, averaging } = opts;
	const samples: Sample[] = [];
	const warnings: string[] = [];
	const memberOf = new Map<number, Set<number>>();
	unitIds.forEach((id, k) => {
		const zones = members.filter((m) => m.unitId === id).map((m) => m.zone);
		if (zones.length) memberOf.set(k, new Set(zones));
	});
	for (const s of soundingList) {
		const needsChainage =
			geometry === '2d' ||
			[...memberOf].some(([k, zones]) => !zones.has(WHOLE_UNIT) && (boundaries.get(unitIds[k])?.length ?? 0) > 0);
		if (needsChainage && s.chainage === null) {
			warnings.push(`${s.name} has no chainage (no section line or easting/northing) and is left out.`);
			continue;
		}
		if (geometry === '3d' && (s.x === null || s.y === null)) {
			warnings.push(`${s.name} has no easting/northing and is left out of this 3D domain.`);
			continue;
		}
		const z: number[] = [];
		const v: number[] = [];
		for (let i = 0; i < s.elevation.length; i++) {
			const zones = memberOf.get(s.unit[i]);
			if (!zones || !Number.isFinite(s.value[i])) continue;
			if (!zones.has(WHOLE_UNIT)) {
				const zone = zoneOf(boundaries.get(unitIds[s.unit[i]]) ?? [], s.chainage!, s.elevation[i]);
				if (!zones.has(zone)) continue;
			}
			z.push(s.elevation[i]);
			v.push(s.value[i]);
		}
		const kept = cellHeight && averaging !== 'none' ? averageInWindows(z, v, cellHeight, averaging) : { z, value: v };
		const x = geometry === '2d' ? s.chainage! : s.x!;
		const y = geometry === '2d' ? 0 : s.y!;
		for (let k = 0; k < kept.z.length; k++) samples.push({ x, y, z: kept.z[k], value: kept.value[k], sounding: s.name });
	}
	return { samples, warnings };
}

/**
 * Averages readings of one sounding in windows of height h fixed in elevation (window k spans
 * [k·h, (k+1)·h)), so windows line up between soundings and with a simulation grid of that cell height.
 * Each window with readings gives one sample: the mean or median of its values at the mean elevation of its
 * readings (a window the domain fills only in part is not credited with its centre). Output runs top down.
 * Not mutating.
 * @throws {RangeError} on h not > 0, unequal lengths, or an averaging other than mean or median
 */
export function averageInWindows(
	elevation: ArrayLike<number>,
	value: ArrayLike<number>,
	h: number,
	averaging: 'mean' | 'median'
): { z: number[]; value: number[]; count: number[] } {
	if (!(h > 0) || !Number.isFinite(h)) throw new RangeError('cell height must be > 0');
	if (elevation.length !== value.length) throw new RangeError('elevation and value lengths differ');
	if (averaging !== 'mean' && averaging !== 'median') throw new RangeError('averaging must be mean or median');
	const windows = new Map<number, { z: number[]; v: number[] }>();
	for (let i = 0; i < elevation.length; i++) {
		// The small shift keeps a reading that sits on a window edge in the upper window despite rounding (0.3/0.1 = 2.9999…).
		const k = Math.floor(elevation[i] / h + 1e-9);
		if (!windows.has(k)) windows.set(k, { z: [], v: [] });
		windows.get(k)!.z.push(elevation[i]);
		windows.get(k)!.v.push(value[i]);
	}
	const out = { z: [] as number[], value: [] as number[], count: [] as number[] };
	for (const k of [...windows.keys()].sort((a, b) => b - a)) {
		const w = windows.get(k)!;
		out.z.push(mean(w.z));
		out.value.push(averaging === 'mean' ? mean(w.v) : median(w.v));
		out.count.push(w.v.length);
	}
	return out;
}

/**
 * A weighted empirical CDF: distinct values ascending, each at the midpoint of its cumulative-weight step,
 * p = (Σ earlier weights + ½ own weight) / Σ weights — the plotting position weightedQuantiles uses, so P50
 * read off the curve matches the statistics table. Empty input gives empty arrays.
 */
export function weightedCdf(values: ArrayLike<number>, weights: ArrayLike<number>): Cdf {
	if (values.length !== weights.length) throw new RangeError('values and weights lengths differ');
	const order = Array.from({ length: values.length }, (_, i) => i).filter((i) => weights[i] > 0);
	order.sort((a, b) => values[a] - values[b] || a - b);
	let total = 0;
	for (const i of order) total += weights[i];
	const out: Cdf = { value: [], p: [] };
	let cum = 0;
	let k = 0;
	while (k < order.length) {
		const v = values[order[k]];
		let g = 0;
		while (k < order.length && values[order[k]] === v) g += weights[order[k++]];
		out.value.push(v);
		out.p.push((cum + g / 2) / total);
		cum += g;
	}
	return out;
}

/** n, weighted mean, weighted (population) sd and P10/P50/P90 (geostat weighted statistics); NaN when empty. */
export function domainStatistics(values: ArrayLike<number>, weights: ArrayLike<number>): DomainStats {
	if (values.length === 0) return { n: 0, mean: NaN, sd: NaN, p10: NaN, p50: NaN, p90: NaN };
	const [p10, p50, p90] = weightedQuantiles(values, weights, [0.1, 0.5, 0.9]);
	return {
		n: values.length,
		mean: weightedMean(values, weights),
		sd: Math.sqrt(weightedVariance(values, weights)),
		p10,
		p50,
		p90
	};
}

/**
 * Cell-declustering weights (Deutsch 1989, through the engine's cellDeclusterWeights) for a domain's cell, or
 * equal weights when it sets none; they sum to 1. A cell z of null means one cell over the full height.
 */
export function declusterWeights(samples: Sample[], cell: { x: number; y: number; z: number | null } | null): Float64Array {
	if (samples.length === 0) return new Float64Array(0);
	if (!cell) return new Float64Array(samples.length).fill(1 / samples.length);
	return cellDeclusterWeights(samples, { x: cell.x, y: cell.y, z: cell.z ?? Infinity });
}

/**
 * The conditioning data of a domain with its declustering weights and distributions: pooled over all
 * soundings (declustered) and per sounding (the same weights, renormalised within the sounding).
 * @throws ServiceError 404 when the domain is not in the project
 */
export function domainSamples(projectId: string, domainId: string, db: DbOrTx = getDb()): DomainSamples {
	const { domain, zonation } = getDomain(projectId, domainId, db);
	const site = getSite(projectId, db);
	const derived = deriveSoundings(projectId, undefined, db);
	const unitIds = derived[0]?.units.map((u) => u.id) ?? [];
	const boundaries = boundariesByUnit(projectId, db);
	const { samples, warnings } = extractDomainSamples(
		derived.map((d) => ({
			name: d.sounding.name,
			chainage: d.sounding.chainage,
			x: d.sounding.x,
			y: d.sounding.y,
			elevation: d.derived.elevation,
			unit: d.unit,
			value: d.derived[domain.property]
		})),
		{
			geometry: site.geometry,
			unitIds,
			members: domain.members,
			boundaries,
			cellHeight: domain.cellHeight,
			averaging: domain.averaging
		}
	);
	for (const d of derived) for (const w of d.warnings) if (/off the section line/.test(w)) warnings.push(w);
	const weights = declusterWeights(samples, domain.declusterCell);
	const values = samples.map((s) => s.value);
	const bySounding = new Map<string, number[]>();
	samples.forEach((s, i) => {
		if (!bySounding.has(s.sounding!)) bySounding.set(s.sounding!, []);
		bySounding.get(s.sounding!)!.push(i);
	});
	return {
		domain: {
			id: domain.id,
			name: domain.name,
			zonationId: zonation.id,
			zonationName: zonation.name,
			property: domain.property,
			cellHeight: domain.cellHeight,
			averaging: domain.averaging,
			declusterCell: domain.declusterCell
		},
		property: { key: domain.property, label: PROPERTY_INFO[domain.property].label, unit: PROPERTY_INFO[domain.property].unit },
		lengthUnit: site.lengthUnit,
		geometry: site.geometry,
		samples: {
			x: samples.map((s) => s.x),
			y: samples.map((s) => s.y),
			z: samples.map((s) => s.z),
			value: values,
			sounding: samples.map((s) => s.sounding!)
		},
		weights: Array.from(weights),
		stats: domainStatistics(values, weights),
		soundings: [...bySounding].map(([name, idx]) => {
			const v = idx.map((i) => values[i]);
			const w = idx.map((i) => weights[i]);
			return { name, n: idx.length, mean: weightedMean(v, w), cdf: weightedCdf(v, w) };
		}),
		cdf: weightedCdf(values, weights),
		warnings
	};
}

function mean(a: number[]): number {
	let s = 0;
	for (const v of a) s += v;
	return s / a.length;
}

function median(a: number[]): number {
	const s = [...a].sort((p, q) => p - q);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
