/** A zone boundary in the section: a straight line from its top point to its bottom point (chainage, elevation). */
export interface BoundaryLine {
	chainageTop: number;
	elevationTop: number;
	chainageBottom: number;
	elevationBottom: number;
}

/** Chainage of a boundary line at an elevation, on the line through its two points (extended beyond them). */
export function boundaryChainageAt(b: BoundaryLine, elevation: number): number {
	if (b.elevationTop === b.elevationBottom) return (b.chainageTop + b.chainageBottom) / 2;
	const t = (b.elevationTop - elevation) / (b.elevationTop - b.elevationBottom);
	return b.chainageTop + t * (b.chainageBottom - b.chainageTop);
}

/**
 * The zone of a point (chainage, elevation) within a unit split by boundaries: the number of the unit's
 * boundaries that lie at or west of the point at its elevation, so zones count from 0 by chainage and a point
 * on a boundary belongs to the zone east of it. Boundaries are straight lines, vertical or inclined, taken
 * as extending above and below their end points across the whole unit. Without boundaries the zone is 0.
 * @throws {RangeError} on a non-finite chainage or elevation
 */
export function zoneOf(boundaries: ReadonlyArray<BoundaryLine>, chainage: number, elevation: number): number {
	if (!Number.isFinite(chainage) || !Number.isFinite(elevation)) throw new RangeError('chainage and elevation must be finite');
	let zone = 0;
	for (const b of boundaries) if (boundaryChainageAt(b, elevation) <= chainage) zone++;
	return zone;
}
