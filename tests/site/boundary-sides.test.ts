import { describe, expect, it } from 'vitest';
import { boundarySides, gridDefinition, projectOntoPolyline, zoneOf } from '../../src/lib/site/index';

describe('boundarySides(grid, line, section)', () => {
	// A section 0–10 m in 1 m cells, −4 to 0 m in 1 m cells; an inclined boundary from (4.2, 0) down to (6.2, −4).
	const grid = gridDefinition({ geometry: '2d', chainage: { from: 0, to: 10, cell: 1 }, elevation: { from: -4, to: 0, cell: 1 } });
	const line = { chainageTop: 4.2, elevationTop: 0, chainageBottom: 6.2, elevationBottom: -4 };

	it('boundarySides agrees with zoneOf cell by cell: 1 where zoneOf counts the boundary, 0 where not (2D)', () => {
		const sides = boundarySides(grid, line, { geometry: '2d', sectionLine: null });
		for (let k = 0; k < grid.counts.z; k++)
			for (let i = 0; i < grid.counts.x; i++) {
				const c = i + grid.counts.x * k;
				expect(sides[c], `cell ${i},${k}`).toBe(zoneOf([line], grid.origin.x + i * grid.spacing.x, grid.origin.z + k * grid.spacing.z));
			}
	});

	it('boundarySides follows the incline: at elevation −0.5 the line is at 4.45 (cells from 4.5 on are east), at −3.5 at 5.95', () => {
		const sides = boundarySides(grid, line, { geometry: '2d', sectionLine: null });
		const row = (k: number) => Array.from(sides.subarray(10 * k, 10 * k + 10));
		expect(row(3)).toEqual([0, 0, 0, 0, 1, 1, 1, 1, 1, 1]);
		expect(row(0)).toEqual([0, 0, 0, 0, 0, 0, 1, 1, 1, 1]);
	});

	it('boundarySides in 3D projects each column onto the section line; without a line every cell is −1', () => {
		const block = gridDefinition({ geometry: '3d', x: { from: 0, to: 4, cell: 1 }, y: { from: 0, to: 3, cell: 1 }, elevation: { from: -1, to: 0, cell: 1 } });
		const sectionLine: [number, number][] = [
			[0, 0],
			[4, 4]
		];
		const vertical = { chainageTop: 2.5, elevationTop: 0, chainageBottom: 2.5, elevationBottom: -1 };
		const sides = boundarySides(block, vertical, { geometry: '3d', sectionLine });
		for (let j = 0; j < 3; j++)
			for (let i = 0; i < 4; i++) {
				const ch = projectOntoPolyline(sectionLine, 0.5 + i, 0.5 + j).chainage;
				expect(sides[i + 4 * j]).toBe(ch >= 2.5 ? 1 : 0);
			}
		expect(new Set(boundarySides(block, vertical, { geometry: '3d', sectionLine: null }))).toEqual(new Set([-1]));
	});

	it('boundarySides on a rectilinear grid reads each row at its listed elevation, not origin + k·spacing', () => {
		// Rows centred at −3.5, −1 and −0.25, as a rectilinear grid lists them.
		const rect = { ...grid, counts: { x: 10, y: 1, z: 3 }, z: [-3.5, -1, -0.25] };
		const sides = boundarySides(rect, line, { geometry: '2d', sectionLine: null });
		for (let k = 0; k < 3; k++)
			for (let i = 0; i < 10; i++) expect(sides[i + 10 * k], `cell ${i},${k}`).toBe(zoneOf([line], grid.origin.x + i * grid.spacing.x, rect.z[k]));
		// At −1 the line is at 4.7: cells from 5.5 on are east; at −0.25 at 4.325: from 4.5.
		expect(Array.from(sides.subarray(10, 20))).toEqual([0, 0, 0, 0, 0, 1, 1, 1, 1, 1]);
		expect(Array.from(sides.subarray(20, 30))).toEqual([0, 0, 0, 0, 1, 1, 1, 1, 1, 1]);
	});
});
