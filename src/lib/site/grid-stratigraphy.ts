import { effectiveTops, type StoredTop } from './effective-tops';
import type { GridStratigraphy } from './grid-domains';
import type { BoundaryLine } from './zone-of';
import type { Polyline } from './project-onto-polyline';

/** The pieces the stratigraphy is kept in, as the API lists them (soundings located, units in stacking order). */
export interface StratigraphyParts {
	sectionLine: Polyline | null;
	soundings: ReadonlyArray<{ id: string; name: string; chainage: number | null; x: number | null; y: number | null; groundElevation: number }>;
	/** Top of the stack first. */
	units: ReadonlyArray<{ id: string; name: string }>;
	contacts: ReadonlyArray<{ soundingId: string; unitId: string; topElevation: number; interpolated?: boolean }>;
	boundaries: ReadonlyArray<BoundaryLine & { unitId: string }>;
}

/**
 * The stratigraphy gridDomains reads, from the project's soundings, units, contacts and zone boundaries: each
 * sounding with its ground elevation and each unit's top as the section takes it (effectiveTops: the stored
 * contacts, measured or interpolated, and the top unit from the ground surface where none is stored; NaN where
 * the unit is absent), each unit's boundaries. The server (from the database) and the browser (from the API)
 * build it the same way, so the grid the form previews is the grid the recipe stores. Not mutating.
 */
export function gridStratigraphy(parts: StratigraphyParts): GridStratigraphy {
	const stored = new Map<string, Map<string, StoredTop>>();
	for (const c of parts.contacts) {
		if (!stored.has(c.soundingId)) stored.set(c.soundingId, new Map());
		stored.get(c.soundingId)!.set(c.unitId, { top: c.topElevation, interpolated: c.interpolated ?? false });
	}
	const unitIds = parts.units.map((u) => u.id);
	return {
		sectionLine: parts.sectionLine,
		units: parts.units.map((u) => ({ id: u.id, name: u.name })),
		stations: parts.soundings.map((s) => {
			const tops = effectiveTops(unitIds, stored.get(s.id) ?? new Map(), s.groundElevation);
			return { name: s.name, chainage: s.chainage, x: s.x, y: s.y, ground: s.groundElevation, tops: unitIds.map((id) => tops.get(id)?.top ?? NaN) };
		}),
		boundaries: parts.units.map((u) =>
			parts.boundaries
				.filter((b) => b.unitId === u.id)
				.map(({ chainageTop, elevationTop, chainageBottom, elevationBottom }) => ({ chainageTop, elevationTop, chainageBottom, elevationBottom }))
		)
	};
}
