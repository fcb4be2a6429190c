import { projectOntoPolyline, type Polyline } from './project-onto-polyline';
import { boundaryChainageAt, type BoundaryLine } from './zone-of';
import { cellElevation, type GridDefinition } from './grid-domains';

/**
 * Which side of a zone boundary each cell centre of a grid lies on, in the engine's target order (x fastest,
 * then y, then z): 1 when the boundary's chainage at the cell's elevation is at or west of the cell's chainage
 * (the side zoneOf counts as the next zone), 0 when east of it; the line is taken as extending above and below
 * its end points across the whole grid, as zoneOf takes it. A cell's chainage is its x in a section (2D), its
 * projection onto the section line in plan in 3D; −1 where it cannot be told (3D without a section line, or a
 * non-finite projection). Coordinates are computed as the engine computes its targets (origin + index·spacing;
 * the listed elevations of a rectilinear grid's rows, `z`).
 */
export function boundarySides(grid: GridDefinition, line: BoundaryLine, section: { geometry: '2d' | '3d'; sectionLine: Polyline | null }): Int8Array {
	const { origin, spacing, counts } = grid;
	const plane = counts.x * counts.y;
	const out = new Int8Array(plane * counts.z);
	const chainages = new Float64Array(plane);
	for (let j = 0; j < counts.y; j++) {
		const y = origin.y + j * spacing.y;
		for (let i = 0; i < counts.x; i++) {
			const x = origin.x + i * spacing.x;
			let c = NaN;
			if (section.geometry === '2d') c = x;
			else if (section.sectionLine && section.sectionLine.length >= 2) c = projectOntoPolyline(section.sectionLine, x, y).chainage;
			chainages[i + counts.x * j] = c;
		}
	}
	for (let k = 0; k < counts.z; k++) {
		const at = boundaryChainageAt(line, cellElevation(grid, k));
		for (let p = 0; p < plane; p++) {
			const c = chainages[p];
			out[p + plane * k] = Number.isFinite(c) && Number.isFinite(at) ? (at <= c ? 1 : 0) : -1;
		}
	}
	return out;
}
