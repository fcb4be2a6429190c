/** How a new domain starts: its samples averaged over cells of a height, and a plan cell for declustering. */
export interface DomainDefaults {
	cellHeight: number;
	averaging: 'mean';
	declusterCell: { x: number; y: number; z: null };
}

/**
 * The settings a new domain starts with, in the project's length unit: readings averaged to 0.2 m cells (about
 * ten CPT readings at the usual 2 cm spacing, still well inside vertical ranges of a few tenths of a metre and
 * more) and 40 m plan cells for declustering (about twice the spacing of soundings along a levee; common
 * practice, from memory). Feet projects take the same lengths rounded to figures people use: 0.5 ft and
 * 130 ft. The demo's domains use the metric values. Each is a starting point to change on the domain pages.
 */
export function domainDefaults(lengthUnit: 'm' | 'ft'): DomainDefaults {
	const { cellHeight, cell } = lengthUnit === 'ft' ? { cellHeight: 0.5, cell: 130 } : { cellHeight: 0.2, cell: 40 };
	return { cellHeight, averaging: 'mean', declusterCell: { x: cell, y: cell, z: null } };
}
