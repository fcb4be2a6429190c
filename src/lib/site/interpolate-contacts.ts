import { interpolateAlongChainage } from './interpolate-along-chainage';
import { triangulatedSurface } from './triangulated-surface';

/** A sounding with contacts of its own: where it is, and its stored unit tops (a unit absent there has none). */
export interface ContactStation {
	chainage: number | null;
	x: number | null;
	y: number | null;
	tops: ReadonlyMap<string, number>;
}

/** The sounding that takes interpolated contacts. */
export interface ContactTarget {
	chainage: number | null;
	x: number | null;
	y: number | null;
	groundElevation: number;
}

/**
 * Contacts for a sounding without contacts of its own, from its neighbours: in a 2D section each unit's top
 * linearly along chainage between the two neighbouring stations, constant beyond the first and last
 * (interpolateAlongChainage); in 3D linearly over the Delaunay triangulation of the stations in plan
 * (triangulatedSurface). A unit absent at a neighbour is absent here too, since its pinch-out cannot be
 * placed between them. A top above the target's ground surface is lowered to it. Stations that cannot be
 * placed (no chainage in 2D, no easting/northing in 3D) are left out.
 *
 * Returns the tops by unit id, or null when the target cannot be placed or no station can. Not mutating.
 */
export function interpolateContacts(
	stations: ReadonlyArray<ContactStation>,
	unitIds: readonly string[],
	target: ContactTarget,
	geometry: '2d' | '3d'
): Map<string, number> | null {
	const placed = stations.filter((s) => (geometry === '2d' ? isFiniteNumber(s.chainage) : isFiniteNumber(s.x) && isFiniteNumber(s.y)));
	const canPlace = geometry === '2d' ? isFiniteNumber(target.chainage) : isFiniteNumber(target.x) && isFiniteNumber(target.y);
	if (placed.length === 0 || !canPlace) return null;
	const out = new Map<string, number>();
	for (const id of unitIds) {
		const valueAt = (s: ContactStation) => s.tops.get(id) ?? NaN;
		const top =
			geometry === '2d'
				? interpolateAlongChainage(placed.map((s) => ({ chainage: s.chainage!, value: valueAt(s) })), target.chainage!)
				: triangulatedSurface(placed.map((s) => ({ x: s.x!, y: s.y!, value: valueAt(s) })))(target.x!, target.y!);
		if (Number.isFinite(top)) out.set(id, Math.min(top, target.groundElevation));
	}
	return out;
}

function isFiniteNumber(v: number | null): v is number {
	return v !== null && Number.isFinite(v);
}
