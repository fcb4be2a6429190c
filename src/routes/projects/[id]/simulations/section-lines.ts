// What a section map draws over the cells: the ground, each unit's contacts in its colour, the zone boundaries
// dashed, and the soundings as vertical lines.
import type { SectionView } from '$lib/api';
import type { FieldLine, FieldSounding } from '$lib/plots/FieldPlot.svelte';

/** Ground, contacts and zone boundaries of the section (none without a section). */
export function sectionLines(section: SectionView | null): FieldLine[] {
	if (!section) return [];
	const colour = new Map(section.units.map((x) => [x.id, x.colour]));
	const out: FieldLine[] = [{ colour: '#292524', points: section.soundings.map((s) => [s.chainage, s.groundElevation] as [number, number]), width: 1.4 }];
	for (const c of section.contacts) for (const pts of c.lines) out.push({ colour: colour.get(c.unitId) ?? '#57534e', points: pts, width: 1.2 });
	for (const b of section.boundaries) {
		out.push({ colour: '#292524', points: [[b.chainageTop, b.elevationTop], [b.chainageBottom, b.elevationBottom]], dashed: true, width: 1.4 });
	}
	return out;
}

/** The located soundings as vertical lines from the ground to their last reading. */
export function sectionSoundings(section: SectionView | null): FieldSounding[] {
	if (!section) return [];
	return section.soundings.map((s) => ({ name: s.name, x: s.chainage, top: s.groundElevation, bottom: s.elevation.length ? s.elevation[s.elevation.length - 1] : s.groundElevation }));
}
