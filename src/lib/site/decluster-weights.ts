import { cellDeclusterWeights, type Sample } from '../geostat';

/** A domain's declustering cell; z null means one cell over the full height (usual for vertical soundings). */
export interface DeclusterCell {
	x: number;
	y: number;
	z: number | null;
}

/**
 * Declustering weights of a domain's samples: cell weights (Deutsch 1989, the engine's cellDeclusterWeights)
 * for its cell, or equal weights when it sets none. They sum to 1; no samples give none.
 * @throws the RangeErrors of cellDeclusterWeights on a cell size that is not > 0
 */
export function declusterWeights(samples: Sample[], cell: DeclusterCell | null): Float64Array {
	if (samples.length === 0) return new Float64Array(0);
	if (!cell) return new Float64Array(samples.length).fill(1 / samples.length);
	return cellDeclusterWeights(samples, { x: cell.x, y: cell.y, z: cell.z ?? Infinity });
}
