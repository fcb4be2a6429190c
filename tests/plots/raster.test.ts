import { describe, expect, it } from 'vitest';
import { colourTable, expandRuns, lineRaster, paintDomains, paintValues, planRaster, sectionRaster } from '../../src/lib/plots/raster';

// A 4 × 3 × 2 grid (x fastest, then y, then z) of 2 m × 5 m × 0.5 m cells, first centre at (1, 2.5, −0.75).
const grid = { origin: { x: 1, y: 2.5, z: -0.75 }, spacing: { x: 2, y: 5, z: 0.5 }, counts: { x: 4, y: 3, z: 2 } };
const section = { origin: { x: 1, y: 0, z: -0.75 }, spacing: { x: 2, y: 1, z: 0.5 }, counts: { x: 4, y: 1, z: 2 } };

describe('rasters of a grid', () => {
	it('sectionRaster puts the top elevation row first; edges are half a cell outside the centres', () => {
		const r = sectionRaster(section);
		expect([r.cols, r.rows]).toEqual([4, 2]);
		expect(Array.from(r.cell)).toEqual([4, 5, 6, 7, 0, 1, 2, 3]);
		expect(r.x).toEqual({ from: 0, step: 2 });
		expect(r.y).toEqual({ from: -1, step: 0.5 });
	});

	it('sectionRaster of variable cell heights: rows of the smallest height, each showing the cell that holds it', () => {
		// Two columns; cells 1 m tall from −3 to −1, then 0.5 m tall to 0 (centres −2.5, −1.5, −0.75, −0.25).
		const g = { origin: { x: 1, y: 0, z: -2.5 }, spacing: { x: 2, y: 1, z: 0.5 }, counts: { x: 2, y: 1, z: 4 }, z: [-2.5, -1.5, -0.75, -0.25], zEdges: [-3, -2, -1, -0.5, 0] };
		const r = sectionRaster(g);
		expect([r.cols, r.rows, r.y.from, r.y.step]).toEqual([2, 6, -3, 0.5]);
		// Rows from the top: cell rows 3, 2, 1, 1, 0, 0 (the 1 m cells span two rows each).
		expect(Array.from(r.cell.filter((_, p) => p % 2 === 0))).toEqual([6, 4, 2, 2, 0, 0]);
	});

	it('planRaster at elevation row k shows that layer, the northernmost row first', () => {
		const r = planRaster(grid, 1);
		expect([r.cols, r.rows]).toEqual([4, 3]);
		expect(Array.from(r.cell.slice(0, 4))).toEqual([20, 21, 22, 23]);
		expect(Array.from(r.cell.slice(8, 12))).toEqual([12, 13, 14, 15]);
		expect(r.y).toEqual({ from: 0, step: 5 });
	});

	it('lineRaster along the middle row from west to east shows that row’s columns; outside the grid is −1', () => {
		const r = lineRaster(grid, [0, 7.5], [8, 7.5], 2);
		expect([r.cols, r.rows]).toEqual([4, 2]);
		expect(Array.from(r.cell)).toEqual([16, 17, 18, 19, 4, 5, 6, 7]);
		expect(r.x).toEqual({ from: 0, step: 2 });
		const off = lineRaster(grid, [100, 100], [120, 100], 10);
		expect(Array.from(off.cell).every((c) => c === -1)).toBe(true);
	});
});

describe('painting', () => {
	const lut = colourTable((t) => `rgb(${Math.round(255 * t)}, 0, ${Math.round(255 * (1 - t))})`, (c) => c.match(/\d+/g)!.map(Number) as [number, number, number]);
	it('colourTable samples the interpolator at 256 steps', () => {
		expect(Array.from(lut.slice(0, 3))).toEqual([0, 0, 255]);
		expect(Array.from(lut.slice(255 * 3))).toEqual([255, 0, 0]);
	});

	it('paintValues maps [lo, hi] onto the table (clamped), greys muted cells and leaves NaN and no-cell pixels clear', () => {
		const r = { cols: 5, rows: 1, cell: Int32Array.from([0, 1, 2, 3, -1]), x: { from: 0, step: 1 }, y: { from: 0, step: 1 } };
		const px = paintValues(r, [10, 30, 99, NaN], lut, 10, 20, (c) => c === 2);
		expect(Array.from(px.slice(0, 4))).toEqual([0, 0, 255, 255]);
		expect(Array.from(px.slice(4, 8))).toEqual([255, 0, 0, 255]);
		expect(Array.from(px.slice(8, 12))).toEqual([231, 229, 228, 255]);
		expect(Array.from(px.slice(12, 20))).toEqual([0, 0, 0, 0, 0, 0, 0, 0]);
	});

	it('paintDomains colours each cell by its domain and leaves −1 clear; expandRuns undoes the run-length encoding', () => {
		const domain = expandRuns([[0, 2], [-1, 1], [1, 1]]);
		expect(Array.from(domain)).toEqual([0, 0, -1, 1]);
		const r = { cols: 4, rows: 1, cell: Int32Array.from([0, 1, 2, 3]), x: { from: 0, step: 1 }, y: { from: 0, step: 1 } };
		const px = paintDomains(r, domain, [[1, 2, 3], [4, 5, 6]]);
		expect(Array.from(px)).toEqual([1, 2, 3, 255, 1, 2, 3, 255, 0, 0, 0, 0, 4, 5, 6, 255]);
	});
});
