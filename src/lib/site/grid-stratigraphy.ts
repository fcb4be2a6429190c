import type { GridStratigraphy } from './grid-domains';
import type { BoundaryLine } from './zone-of';
import type { Polyline } from './project-onto-polyline';

/** The pieces the stratigraphy is kept in, as the API lists them (soundings located, units in stacking order). */
export interface StratigraphyParts {
	sectionLine: Polyline | null;
	soundings: ReadonlyArray<{ id: string; name: string; chainage: number | null; x: number | null; y: number | null; groundElevation: number }>;
	/** Top of the stack first. */
	units: ReadonlyArray<{ id: string; name: string }>;
	contacts: ReadonlyArray<{ soundingId: string; unitId: string; topElevation: number }>;
	boundaries: ReadonlyArray<BoundaryLine & { unitId: string }>;
}

/**
 * The stratigraphy gridDomains reads, from the project's soundings, units, contacts and zone boundaries: each
 * sounding with its ground elevation and each unit's top (NaN where the unit has no contact, i.e. is absent),
 * each unit's boundaries. The server (from the database) and the browser (from the API) build it
 * the same way, so the grid the form previews is the grid the recipe stores. Not mutating.
 */
export function gridStratigraphy(parts: StratigraphyParts): GridStratigraphy {
	const top = new Map<string, number>();
	for (const c of parts.contacts) top.set(`${c.soundingId}|${c.unitId}`, c.topElevation);
	return {
		sectionLine: parts.sectionLine,
		units: parts.units.map((u) => ({ id: u.id, name: u.name })),
		stations: parts.soundings.map((s) => ({
			name: s.name,
			chainage: s.chainage,
			x: s.x,
			y: s.y,
			ground: s.groundElevation,
			tops: parts.units.map((u) => top.get(`${s.id}|${u.id}`) ?? NaN)
		})),
		boundaries: parts.units.map((u) =>
			parts.boundaries
				.filter((b) => b.unitId === u.id)
				.map(({ chainageTop, elevationTop, chainageBottom, elevationBottom }) => ({ chainageTop, elevationTop, chainageBottom, elevationBottom }))
		)
	};
}
