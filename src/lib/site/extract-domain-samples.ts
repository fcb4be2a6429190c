import type { Sample } from '../geostat';
import { averageInWindows } from './average-in-windows';
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
}

/**
 * A domain's property samples: the readings of each sounding that fall in a member unit (and member zone,
 * by {@link zoneOf} at the reading's chainage and elevation) with a finite value, averaged to the cell height
 * when asked ({@link averageInWindows}). Readings with NaN values (e.g. where the correlation is undefined) are
 * left out. In 2D a sample's x is the chainage and y is 0; in 3D x and y are easting and northing. Soundings
 * that cannot be placed are left out and named in `warnings`. Not mutating.
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
	const needsChainage =
		geometry === '2d' || [...memberOf].some(([k, zones]) => !zones.has(WHOLE_UNIT) && (boundaries.get(unitIds[k])?.length ?? 0) > 0);
	for (const s of soundingList) {
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
