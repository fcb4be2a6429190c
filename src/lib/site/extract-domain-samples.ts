import type { Sample } from '../geostat';
import { averageInWindows } from './average-in-windows';
import { DEFAULT_RULES, emptyRuleCounts, readingRule, type ConditioningRules, type RuleCounts } from './conditioning-rules';
import { WHOLE_UNIT, type Member } from './members-overlap';
import { zoneOf, type BoundaryLine } from './zone-of';

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
	/** Ground elevation, for depths (the top reading's elevation when omitted). */
	groundElevation?: number;
	/** σ′v of each reading (kPa), for the minimum σ′v rule; NaN where unknown. */
	sigmaVeff?: ArrayLike<number>;
	/** Whether each reading carries a flag of the domain property's correlation. */
	flagged?: ArrayLike<boolean>;
	/**
	 * Top elevations of the units at this sounding (its contacts). Those below the ground surface are the
	 * transitions the contact buffer keeps away from; none at all means the sounding has no contacts yet.
	 */
	contacts?: number[];
}

export interface ExtractOptions {
	geometry: '2d' | '3d';
	/** Unit id of each unit index used by ExtractSounding.unit. */
	unitIds: string[];
	members: Member[];
	/** Zone boundaries per unit id. */
	boundaries: Map<string, BoundaryLine[]>;
	/** Averaging window height; null for every reading. */
	cellHeight: number | null;
	averaging: 'none' | 'mean' | 'median';
	/** Which readings condition the domain; default DEFAULT_RULES (all). */
	rules?: ConditioningRules;
}

/** A sounding that adds nothing to the domain, and why. */
export interface LeftOutSounding {
	name: string;
	reason: 'excluded' | 'no contacts' | 'no chainage' | 'no easting/northing';
}

/** The samples of a domain with what was left out. */
export interface ExtractResult {
	samples: Sample[];
	/** The same, worded for a page. */
	warnings: string[];
	leftOut: LeftOutSounding[];
	/** The domain's readings and what each rule removed (before averaging). */
	counts: RuleCounts;
}

/**
 * A domain's property samples: the readings of each sounding that fall in a member unit (and member zone,
 * by {@link zoneOf} at the reading's chainage and elevation), pass the domain's conditioning rules
 * ({@link readingRule}: soundings left out by name, undefined values, minimum depth, minimum σ′v, a buffer
 * around contacts, flagged readings), averaged to the cell height when asked ({@link averageInWindows}).
 * In 2D a sample's x is the chainage and y is 0; in 3D x and y are easting and northing. Soundings that cannot
 * be placed, have no contacts or are left out by name are listed in `leftOut` (and worded in `warnings`);
 * `counts` says how many of the domain's readings each rule removed. Not mutating.
 */
export function extractDomainSamples(soundingList: ExtractSounding[], opts: ExtractOptions): ExtractResult {
	const { geometry, unitIds, members, boundaries, cellHeight, averaging, rules = DEFAULT_RULES } = opts;
	const samples: Sample[] = [];
	const warnings: string[] = [];
	const leftOut: LeftOutSounding[] = [];
	const counts = emptyRuleCounts();
	const excluded = new Set(rules.excludedSoundings);
	const memberOf = new Map<number, Set<number>>();
	unitIds.forEach((id, k) => {
		const zones = members.filter((m) => m.unitId === id).map((m) => m.zone);
		if (zones.length) memberOf.set(k, new Set(zones));
	});
	const needsChainage =
		geometry === '2d' || [...memberOf].some(([k, zones]) => !zones.has(WHOLE_UNIT) && (boundaries.get(unitIds[k])?.length ?? 0) > 0);
	for (const s of soundingList) {
		if (s.contacts !== undefined && s.contacts.length === 0 && unitIds.length > 0) {
			leftOut.push({ name: s.name, reason: 'no contacts' });
			warnings.push(`${s.name} has no contacts yet, so none of its readings lie in a unit; it adds nothing to this domain.`);
			continue;
		}
		if (needsChainage && s.chainage === null) {
			leftOut.push({ name: s.name, reason: 'no chainage' });
			warnings.push(`${s.name} has no chainage (no section line or easting/northing) and is left out.`);
			continue;
		}
		if (geometry === '3d' && (s.x === null || s.y === null)) {
			leftOut.push({ name: s.name, reason: 'no easting/northing' });
			warnings.push(`${s.name} has no easting/northing and is left out of this 3D domain.`);
			continue;
		}
		const dropped = excluded.has(s.name);
		const ground = s.groundElevation ?? (s.elevation.length ? s.elevation[0] : 0);
		const contacts = (s.contacts ?? []).filter((c) => c < ground - 1e-9);
		const z: number[] = [];
		const v: number[] = [];
		for (let i = 0; i < s.elevation.length; i++) {
			const zones = memberOf.get(s.unit[i]);
			if (!zones) continue;
			if (!zones.has(WHOLE_UNIT)) {
				const zone = zoneOf(boundaries.get(unitIds[s.unit[i]]) ?? [], s.chainage!, s.elevation[i]);
				if (!zones.has(zone)) continue;
			}
			counts.readings++;
			if (dropped) {
				counts.sounding++;
				continue;
			}
			const rule = readingRule(
				{
					value: s.value[i],
					depth: ground - s.elevation[i],
					elevation: s.elevation[i],
					sigmaVeff: s.sigmaVeff ? s.sigmaVeff[i] : NaN,
					flagged: s.flagged ? !!s.flagged[i] : false
				},
				contacts,
				rules
			);
			if (rule) {
				counts[rule]++;
				continue;
			}
			counts.kept++;
			z.push(s.elevation[i]);
			v.push(s.value[i]);
		}
		if (dropped) {
			leftOut.push({ name: s.name, reason: 'excluded' });
			continue;
		}
		const kept = cellHeight && averaging !== 'none' ? averageInWindows(z, v, cellHeight, averaging) : { z, value: v };
		const x = geometry === '2d' ? s.chainage! : s.x!;
		const y = geometry === '2d' ? 0 : s.y!;
		for (let k = 0; k < kept.z.length; k++) samples.push({ x, y, z: kept.z[k], value: kept.value[k], sounding: s.name });
	}
	return { samples, warnings, leftOut, counts };
}
