import { weightedMean } from '$lib/geostat';
import { correlationFlagMask, PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { getDb } from '$lib/server/db';
import type { Averaging } from '$lib/server/db/site-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
import {
	declusterWeights,
	domainStatistics,
	extractDomainSamples,
	weightedCdf,
	type Cdf,
	type ConditioningRules,
	type DomainStats,
	type LeftOutSounding,
	type RuleCounts
} from '$lib/site';
import { deriveSoundings } from './derived';
import { getSite } from './site';
import { boundariesByUnit } from './stratigraphy';
import { getDomain } from './zonations';

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
		/** The conditioning data rules applied. */
		rules: ConditioningRules;
	};
	property: { key: SimulatedProperty; label: string; unit: string };
	lengthUnit: 'm' | 'ft';
	geometry: '2d' | '3d';
	/** 2D: x = chainage, y = 0; 3D: x = easting, y = northing. z = elevation. */
	samples: { x: number[]; y: number[]; z: number[]; value: number[]; sounding: string[] };
	/** Declustering weights summing to 1 (equal when the domain sets no cell). */
	weights: number[];
	/** NaN statistics of an empty domain are null in JSON. */
	stats: DomainStats;
	soundings: { name: string; n: number; mean: number; cdf: Cdf }[];
	cdf: Cdf;
	/** Soundings left out and why (no contacts, no chainage, no easting/northing, left out by name), worded. */
	warnings: string[];
	/** The same soundings with their reasons. */
	leftOut: LeftOutSounding[];
	/** The readings in the domain's units and zones, and how many each conditioning rule left out (before averaging). */
	counts: RuleCounts;
}

/**
 * The conditioning data of a domain with its declustering weights and distributions: pooled over all
 * soundings (declustered) and per sounding (the same weights, renormalised within the sounding). The
 * domain's conditioning rules are applied here (extractDomainSamples), so everything built on these samples —
 * variograms, and the recipes that resolve a domain through this service — sees only the kept readings.
 * Readings flagged as outside the property's correlation are those with one of the catalogue's flags for it.
 * @throws ServiceError 404 when the domain is not in the project
 */
export function domainSamples(projectId: string, domainId: string, db: DbOrTx = getDb()): DomainSamples {
	const { domain, zonation } = getDomain(projectId, domainId, db);
	const site = getSite(projectId, db);
	const derived = deriveSoundings(projectId, undefined, db);
	const unitIds = derived[0]?.units.map((u) => u.id) ?? [];
	const boundaries = boundariesByUnit(projectId, db);
	const mask = correlationFlagMask(domain.property);
	const { samples, warnings, leftOut, counts } = extractDomainSamples(
		derived.map((d) => ({
			name: d.sounding.name,
			chainage: d.sounding.chainage,
			x: d.sounding.x,
			y: d.sounding.y,
			groundElevation: d.sounding.groundElevation,
			elevation: d.derived.elevation,
			unit: d.unit,
			value: d.derived[domain.property],
			sigmaVeff: d.derived.sigmaVeff,
			flagged: Array.from(d.flags, (f) => (f & mask) !== 0),
			contacts: placedTops(d.units)
		})),
		{
			geometry: site.geometry,
			unitIds,
			members: domain.members,
			boundaries,
			cellHeight: domain.cellHeight,
			averaging: domain.averaging,
			rules: domain.rules
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
			declusterCell: domain.declusterCell,
			rules: domain.rules
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
		warnings,
		leftOut,
		counts
	};
}

/**
 * The unit tops that place a sounding's readings: none when no top was measured or interpolated there and the
 * project has several units, since the ground-surface default of the top unit alone would put every reading of
 * the sounding in the top unit (the sounding is then left out, with the reason 'no contacts').
 */
function placedTops(units: { topElevation: number | null; topSource: string | null }[]): number[] {
	const tops = units.flatMap((u) => (u.topElevation === null ? [] : [u.topElevation]));
	const placed = units.some((u) => u.topSource !== null && u.topSource !== 'ground');
	return placed || units.length < 2 ? tops : [];
}
