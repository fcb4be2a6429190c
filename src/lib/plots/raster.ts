/**
 * Rasters of a recipe's grid for the canvas: which cell each pixel shows (a 2D section, a plan slice at an
 * elevation, or a vertical slice along a line through a 3D grid) and the pixels' colours. Pure, so it is tested
 * in Node; the page draws the RGBA bytes with putImageData.
 */
import type { GridDefinition } from '$lib/site';

/** A picture of cells: `cell[row · cols + col]` is a target index (−1: none), row 0 at the top. */
export interface Raster {
	cols: number;
	rows: number;
	cell: Int32Array;
	/** The horizontal axis: the left edge of column 0 and the width of a column, in the project's length unit. */
	x: { from: number; step: number };
	/** The vertical axis: the bottom edge of the last row and the height of a row. */
	y: { from: number; step: number };
}

/**
 * The rows of a raster along the elevation, from the top down: one per cell row, or with variable cell heights
 * (grid.zEdges) rows of the smallest height (at most 2000), each showing the cell row that holds its centre.
 */
function elevationRows(grid: GridDefinition): { rows: number; k: Int32Array; from: number; step: number } {
	const { origin, spacing, counts, zEdges } = grid;
	if (!zEdges) {
		const k = Int32Array.from({ length: counts.z }, (_, r) => counts.z - 1 - r);
		return { rows: counts.z, k, from: origin.z - spacing.z / 2, step: spacing.z };
	}
	const bottom = zEdges[0];
	const top = zEdges[zEdges.length - 1];
	let smallest = Infinity;
	for (let m = 1; m < zEdges.length; m++) smallest = Math.min(smallest, zEdges[m] - zEdges[m - 1]);
	const rows = Math.min(2000, Math.max(counts.z, Math.round((top - bottom) / smallest)));
	const step = (top - bottom) / rows;
	const k = new Int32Array(rows);
	let m = counts.z - 1;
	for (let r = 0; r < rows; r++) {
		const z = top - (r + 0.5) * step;
		while (m > 0 && zEdges[m] > z) m--;
		k[r] = m;
	}
	return { rows, k, from: bottom, step };
}

/** A 2D section grid (or one row of a 3D grid, j): columns along x, rows from the top elevation down. */
export function sectionRaster(grid: GridDefinition, j = 0): Raster {
	const { origin, spacing, counts } = grid;
	const cols = counts.x;
	const ez = elevationRows(grid);
	const rows = ez.rows;
	const cell = new Int32Array(cols * rows);
	for (let r = 0; r < rows; r++) {
		const k = ez.k[r];
		for (let i = 0; i < cols; i++) cell[r * cols + i] = i + counts.x * (j + counts.y * k);
	}
	return { cols, rows, cell, x: { from: origin.x - spacing.x / 2, step: spacing.x }, y: { from: ez.from, step: ez.step } };
}

/** A plan slice of a 3D grid at elevation row k: columns along x (east), rows from the north down. */
export function planRaster(grid: GridDefinition, k: number): Raster {
	const { origin, spacing, counts } = grid;
	const cols = counts.x;
	const rows = counts.y;
	const cell = new Int32Array(cols * rows);
	for (let r = 0; r < rows; r++) {
		const j = rows - 1 - r;
		for (let i = 0; i < cols; i++) cell[r * cols + i] = i + counts.x * (j + counts.y * k);
	}
	return { cols, rows, cell, x: { from: origin.x - spacing.x / 2, step: spacing.x }, y: { from: origin.y - spacing.y / 2, step: spacing.y } };
}

/**
 * A vertical slice of a 3D grid along the straight line from `a` to `b` in plan: columns every `step` along the
 * line (default the smaller plan cell), each showing the column of cells that holds its point (−1 outside the
 * grid). The horizontal axis is the distance along the line from `a`.
 */
export function lineRaster(grid: GridDefinition, a: [number, number], b: [number, number], step = Math.min(grid.spacing.x, grid.spacing.y)): Raster {
	const { origin, spacing, counts } = grid;
	const length = Math.sqrt((b[0] - a[0]) * (b[0] - a[0]) + (b[1] - a[1]) * (b[1] - a[1]));
	const cols = Math.max(1, Math.round(length / step));
	const ez = elevationRows(grid);
	const rows = ez.rows;
	const cell = new Int32Array(cols * rows).fill(-1);
	for (let c = 0; c < cols; c++) {
		const t = cols === 1 ? 0 : (c + 0.5) / cols;
		const px = a[0] + t * (b[0] - a[0]);
		const py = a[1] + t * (b[1] - a[1]);
		const i = Math.round((px - origin.x) / spacing.x);
		const j = Math.round((py - origin.y) / spacing.y);
		if (i < 0 || j < 0 || i >= counts.x || j >= counts.y) continue;
		for (let r = 0; r < rows; r++) cell[r * cols + c] = i + counts.x * (j + counts.y * ez.k[r]);
	}
	return { cols, rows, cell, x: { from: 0, step: length / cols }, y: { from: ez.from, step: ez.step } };
}

/** A colour as [r, g, b] bytes. */
export type Rgb = [number, number, number];

/**
 * A 256-entry look-up table of an interpolator on [0, 1] (e.g. d3's interpolateCividis), so painting a few
 * hundred thousand cells does not parse a colour string each.
 */
export function colourTable(interpolate: (t: number) => string, parse: (c: string) => Rgb): Uint8Array {
	const lut = new Uint8Array(256 * 3);
	for (let k = 0; k < 256; k++) lut.set(parse(interpolate(k / 255)), 3 * k);
	return lut;
}

/**
 * RGBA bytes of a raster: a pixel shows `values[cell]` on the table over [lo, hi] (clamped), grey where the
 * cell is `muted` (another property's domain), and stays transparent where there is no cell, the cell is not
 * simulated (NaN) or `show` is false for it.
 */
export function paintValues(
	raster: Raster,
	values: ArrayLike<number>,
	lut: Uint8Array,
	lo: number,
	hi: number,
	muted: (cell: number) => boolean = () => false
): Uint8ClampedArray {
	const out = new Uint8ClampedArray(raster.cols * raster.rows * 4);
	const span = hi > lo ? hi - lo : 1;
	for (let p = 0; p < raster.cell.length; p++) {
		const c = raster.cell[p];
		if (c < 0) continue;
		const v = values[c];
		if (v !== v) continue;
		if (muted(c)) {
			out.set([231, 229, 228, 255], 4 * p);
			continue;
		}
		const t = Math.min(1, Math.max(0, (v - lo) / span));
		const k = Math.round(t * 255);
		out[4 * p] = lut[3 * k];
		out[4 * p + 1] = lut[3 * k + 1];
		out[4 * p + 2] = lut[3 * k + 2];
		out[4 * p + 3] = 255;
	}
	return out;
}

/** RGBA bytes of a raster coloured by domain (−1 transparent): the grid before anything is simulated. */
export function paintDomains(raster: Raster, domain: ArrayLike<number>, colours: Rgb[]): Uint8ClampedArray {
	const out = new Uint8ClampedArray(raster.cols * raster.rows * 4);
	for (let p = 0; p < raster.cell.length; p++) {
		const c = raster.cell[p];
		if (c < 0) continue;
		const d = domain[c];
		if (d < 0 || !colours[d]) continue;
		out.set(colours[d], 4 * p);
		out[4 * p + 3] = 255;
	}
	return out;
}

/** The domain of every target of a grid, from its run-length encoding. */
export function expandRuns(runs: [number, number][]): Int32Array {
	let n = 0;
	for (const [, len] of runs) n += len;
	const out = new Int32Array(n);
	let p = 0;
	for (const [d, len] of runs) {
		out.fill(d, p, p + len);
		p += len;
	}
	return out;
}
