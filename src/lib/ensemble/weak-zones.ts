import { midpointQuantile } from './ensemble-map';

/**
 * The grid the realizations are on: cell counts and sizes, x fastest, then y, then z (the engine's target order).
 * A rectilinear grid of variable cell heights (uniform columns, as the recipe setup makes them) gives `heights`, the
 * height of each row of cells from the bottom (counts.z entries); spacing.z is then not used.
 */
export interface WeakZoneGrid {
	counts: { x: number; y: number; z: number };
	spacing: { x: number; y: number; z: number };
	heights?: ArrayLike<number>;
}

/** The weak zones of one realization, labelled. */
export interface WeakZoneLabels {
	/** Zone of each cell, 0 … zones − 1, numbered in the order their first cell comes in the grid; −1: not weak. */
	labels: Int32Array;
	zones: number;
	/** Cells of each zone. */
	cells: Int32Array;
	/** Horizontal extent of each zone: its span of columns × the cell width (the larger of x and y in 3D). */
	extent: Float64Array;
	/** With variable cell heights: the sum of the heights of each zone's cells (its area ÷ Δx, or volume ÷ ΔxΔy). */
	heightSum?: Float64Array;
}

/** What the weak zones of one realization come to (see weakZoneFigures). */
export interface RealizationWeakZones {
	zones: number;
	/** The greatest horizontal extent of any weak zone (project length unit); 0 without weak cells. */
	largestExtent: number;
	/** The greatest area (section, length unit²) or volume (3D, length unit³) of any weak zone; 0 without weak cells. */
	largestArea: number;
	/** Whether a weak zone holds cells on both sides of the boundary; null when no boundary was given. */
	crossesBoundary: boolean | null;
}

/** Options of weakZones. */
export interface WeakZoneOptions {
	/** A cell is weak when its value is strictly below this. */
	threshold: number;
	/** 1 where a cell can be weak (in a domain simulating the property), 0 elsewhere; one a cell. */
	eligible: Uint8Array;
	/** The horizontal extent a zone must reach for its cells to count in the probability map; default 0 (any zone). */
	minLength?: number;
	/**
	 * The side of the chosen zone boundary each cell centre lies on: 0 or 1 (−1: neither, e.g. no chainage there).
	 * Left out: no boundary, crossesBoundary is null.
	 */
	side?: Int8Array;
	/** A vertical section (area in length unit²) rather than a block (volume); default: when the grid is one cell deep in y. */
	section?: boolean;
}

/** Weak-zone continuity over an ensemble (see weakZones). */
export interface WeakZoneSummary {
	realizations: RealizationWeakZones[];
	/** P10, P50 and P90 of the largest extent over the realizations. */
	largestExtent: { p10: number; p50: number; p90: number };
	/** Fraction of realizations with a weak zone across the boundary; null without a boundary. */
	crossingProbability: number | null;
	/** Fraction of realizations in which the cell lies in a weak zone at least minLength long; NaN where not eligible. */
	probabilityMap: Float64Array;
}

/**
 * Labels the weak zones of one realization: the weak cells (eligible, with a value strictly below `threshold`;
 * NaN is never weak) grouped into face-connected components — 4 neighbours in a vertical section (x and z), 6 in
 * a block (x, y and z); cells that touch only at an edge or a corner are in different zones. Standard connected-
 * component labelling (Rosenfeld & Pfaltz 1966, *Journal of the ACM* 13(4), from memory); this is a flood fill
 * from each unlabelled weak cell in grid order, which gives the same components as any labelling algorithm.
 * A zone's horizontal extent is its span of columns, (i_max − i_min + 1)·Δx; in 3D the larger of that and
 * (j_max − j_min + 1)·Δy. A face-connected zone covers every column of its span, so this is also its number of
 * columns × the cell width. With variable cell heights (grid.heights) each zone also sums its cells' heights.
 * Arithmetic only. Does not mutate its inputs.
 * @throws {RangeError} when values or eligible do not have one entry a cell, heights not one a row, or the threshold
 *   is not finite
 */
export function labelWeakZones(values: ArrayLike<number>, grid: WeakZoneGrid, threshold: number, eligible: Uint8Array): WeakZoneLabels {
	const { x: nx, y: ny, z: nz } = grid.counts;
	const n = nx * ny * nz;
	if (values.length !== n || eligible.length !== n) throw new RangeError('values and eligible need one entry a cell');
	if (!Number.isFinite(threshold)) throw new RangeError('the threshold must be finite');
	const heights = grid.heights;
	if (heights && heights.length !== nz) throw new RangeError('heights need one entry a row of cells');
	const labels = new Int32Array(n).fill(-1);
	const cells: number[] = [];
	const heightSums: number[] = [];
	const extent: number[] = [];
	const stack = new Int32Array(n);
	const plane = nx * ny;
	const weak = (c: number) => eligible[c] === 1 && values[c] < threshold;
	let zones = 0;
	for (let start = 0; start < n; start++) {
		if (labels[start] >= 0 || !weak(start)) continue;
		const zone = zones++;
		let top = 0;
		stack[top++] = start;
		labels[start] = zone;
		let count = 0;
		let heightSum = 0;
		let iMin = nx;
		let iMax = -1;
		let jMin = ny;
		let jMax = -1;
		while (top > 0) {
			const c = stack[--top];
			count++;
			const i = c % nx;
			const j = Math.floor(c / nx) % ny;
			const k = Math.floor(c / plane);
			if (heights) heightSum += heights[k];
			if (i < iMin) iMin = i;
			if (i > iMax) iMax = i;
			if (j < jMin) jMin = j;
			if (j > jMax) jMax = j;
			const visit = (d: number) => {
				if (labels[d] < 0 && weak(d)) {
					labels[d] = zone;
					stack[top++] = d;
				}
			};
			if (i > 0) visit(c - 1);
			if (i < nx - 1) visit(c + 1);
			if (j > 0) visit(c - nx);
			if (j < ny - 1) visit(c + nx);
			if (k > 0) visit(c - plane);
			if (k < nz - 1) visit(c + plane);
		}
		cells.push(count);
		heightSums.push(heightSum);
		const ex = (iMax - iMin + 1) * grid.spacing.x;
		const ey = ny > 1 ? (jMax - jMin + 1) * grid.spacing.y : 0;
		extent.push(ex >= ey ? ex : ey);
	}
	return { labels, zones, cells: Int32Array.from(cells), extent: Float64Array.from(extent), ...(heights ? { heightSum: Float64Array.from(heightSums) } : {}) };
}

/**
 * The figures of one labelled realization: the number of weak zones, the greatest horizontal extent and the
 * greatest area (section: cells × Δx × Δz) or volume (block: cells × Δx × Δy × Δz) of any zone (with variable cell
 * heights: the sum of its cells' heights × Δx, × Δy in a block) — the longest zone and the largest may be
 * different zones; the longest is what continuity is about — and whether a weak zone crosses the boundary: it holds at least one cell with side 0 and one with side 1. Since a zone is face-
 * connected, such a zone has two face-neighbouring cells on either side of the boundary line.
 */
export function weakZoneFigures(z: WeakZoneLabels, grid: WeakZoneGrid, side?: Int8Array, section = grid.counts.y === 1): RealizationWeakZones {
	const column = section ? grid.spacing.x : grid.spacing.x * grid.spacing.y;
	// Regular rows: whole cells × the cell size (exact for the counts); variable rows: the zone's summed heights.
	const size = z.heightSum ? z.heightSum : z.cells;
	const unit = z.heightSum ? column : column * grid.spacing.z;
	let largestExtent = 0;
	let largestSize = 0;
	for (let k = 0; k < z.zones; k++) {
		if (z.extent[k] > largestExtent) largestExtent = z.extent[k];
		if (size[k] > largestSize) largestSize = size[k];
	}
	let crossesBoundary: boolean | null = null;
	if (side) {
		if (side.length !== z.labels.length) throw new RangeError('side needs one entry a cell');
		const seen = new Uint8Array(z.zones);
		crossesBoundary = false;
		for (let c = 0; c < z.labels.length && !crossesBoundary; c++) {
			const zone = z.labels[c];
			const s = side[c];
			if (zone < 0 || (s !== 0 && s !== 1)) continue;
			seen[zone] |= s === 0 ? 1 : 2;
			if (seen[zone] === 3) crossesBoundary = true;
		}
	}
	return { zones: z.zones, largestExtent, largestArea: largestSize * unit, crossesBoundary };
}

/**
 * Weak-zone continuity over an ensemble, a screening measure of how far zones below a threshold run laterally
 * (not a liquefaction triggering or deformation analysis): each realization's weak zones (labelWeakZones) and
 * figures (weakZoneFigures); across the realizations the P10/P50/P90 of the largest extent (midpoint plotting
 * positions (j − ½)/N, linear between, Hyndman & Fan 1996 definition 5: midpointQuantile, as the ensemble maps), the fraction of
 * realizations with a weak zone across the boundary, and for each eligible cell the fraction of realizations in
 * which it lies in a weak zone whose extent is at least minLength. Realizations in realization order.
 * Arithmetic only, in a fixed order, so a browser and the server compute the same bits. Does not mutate its inputs.
 * @throws {RangeError} with no realizations, realizations of unequal length or not one value a cell, a negative
 *   or non-finite minLength, and as labelWeakZones
 */
export function weakZones(realizations: ArrayLike<number>[], grid: WeakZoneGrid, opts: WeakZoneOptions): WeakZoneSummary {
	const { threshold, eligible, minLength = 0, side, section = grid.counts.y === 1 } = opts;
	if (realizations.length === 0) throw new RangeError('no realizations');
	if (!(minLength >= 0) || !Number.isFinite(minLength)) throw new RangeError('minLength must be a finite number >= 0');
	const n = eligible.length;
	const hits = new Int32Array(n);
	const figures = realizations.map((values) => {
		const z = labelWeakZones(values, grid, threshold, eligible);
		for (let c = 0; c < n; c++) {
			const zone = z.labels[c];
			if (zone >= 0 && z.extent[zone] >= minLength) hits[c]++;
		}
		return weakZoneFigures(z, grid, side, section);
	});
	const nr = realizations.length;
	const probabilityMap = new Float64Array(n);
	for (let c = 0; c < n; c++) probabilityMap[c] = eligible[c] === 1 ? hits[c] / nr : NaN;
	const crossingProbability = side ? figures.filter((f) => f.crossesBoundary).length / nr : null;
	return { realizations: figures, largestExtent: largestExtentQuantiles(figures), crossingProbability, probabilityMap };
}

/**
 * P10, P50 and P90 of the realizations' largest extents at the midpoint plotting positions (midpointQuantile, as
 * the ensemble maps), from the per-realization figures alone (what the weak-zones endpoint returns).
 * @throws {RangeError} with no realizations
 */
export function largestExtentQuantiles(realizations: ReadonlyArray<Pick<RealizationWeakZones, 'largestExtent'>>): { p10: number; p50: number; p90: number } {
	if (realizations.length === 0) throw new RangeError('no realizations');
	const sorted = Float64Array.from(realizations, (f) => f.largestExtent).sort();
	const [p10, p50, p90] = [0.1, 0.5, 0.9].map((p) => midpointQuantile(sorted, p));
	return { p10, p50, p90 };
}
