import { describe, expect, it } from 'vitest';
import { axesDomains, elevationCells, gridStratigraphy, pointDomains, unitHeightBands, type GridStratigraphy } from '../../src/lib/site/index';

// A crafted section (m): loose sand from the ground (5 m) down to a dense sand whose top falls from +1 at ch 0 to
// −1 at ch 20, i.e. 1 − ch/10. The grid's columns are 5 m wide: centres at ch 2.5, 7.5, 12.5, 17.5, where the
// dense top stands at 0.75, 0.25, −0.25 and −0.75.
const strat: GridStratigraphy = gridStratigraphy({
	sectionLine: null,
	soundings: [
		{ id: 's1', name: 'S1', chainage: 0, x: null, y: null, groundElevation: 5 },
		{ id: 's2', name: 'S2', chainage: 20, x: null, y: null, groundElevation: 5 }
	],
	units: [
		{ id: 'loose', name: 'Loose sand' },
		{ id: 'dense', name: 'Dense sand' }
	],
	contacts: [
		{ soundingId: 's1', unitId: 'dense', topElevation: 1 },
		{ soundingId: 's2', unitId: 'dense', topElevation: -1 }
	],
	boundaries: []
});
const columns = [2.5, 7.5, 12.5, 17.5].map((x) => ({ x, y: 0 }));

describe('elevationCells(from, to, cell, bands)', () => {
	it('without bands: equal cells of the given height from `from` to `to`', () => {
		const { edges, centres } = elevationCells(-1, 1, 0.5);
		expect(edges).toEqual([-1, -0.5, 0, 0.5, 1]);
		expect(centres).toEqual([-0.75, -0.25, 0.25, 0.75]);
	});

	it('bands: the smallest height that covers an elevation, cut at the band edges', () => {
		const { edges } = elevationCells(-4, 5, 1, [{ bottom: -2, top: 5, cell: 0.5 }]);
		expect(edges.slice(0, 4)).toEqual([-4, -3, -2, -1.5]);
		expect(edges.length).toBe(2 + 14 + 1);
		expect(edges[edges.length - 1]).toBe(5);
		// Overlapping bands: the finer wins where they overlap.
		const o = elevationCells(0, 4, 1, [{ bottom: 0, top: 3, cell: 0.5 }, { bottom: 2, top: 4, cell: 0.25 }]);
		expect(o.edges).toEqual([0, 0.5, 1, 1.5, 2, 2.25, 2.5, 2.75, 3, 3.25, 3.5, 3.75, 4]);
	});

	it('a piece that is not a whole number of cells holds round(length / height) equal cells', () => {
		const { edges } = elevationCells(0, 1, 0.3);
		expect(edges.length).toBe(4);
		expect(edges[1]).toBeCloseTo(1 / 3, 15);
		expect(elevationCells(0, 0.1, 1).edges).toEqual([0, 0.1]);
	});

	it('refuses an empty axis, a height that is not > 0 and an upside-down band', () => {
		expect(() => elevationCells(1, 1, 0.5)).toThrow(RangeError);
		expect(() => elevationCells(0, 1, 0)).toThrow('cell sizes must be > 0');
		expect(() => elevationCells(0, 1, 1, [{ bottom: 0, top: 1, cell: NaN }])).toThrow('cell sizes must be > 0');
		expect(() => elevationCells(0, 1, 1, [{ bottom: 1, top: 0, cell: 0.5 }])).toThrow('a band must run from a lower to a higher elevation');
	});
});

describe('unitHeightBands(stratigraphy, …) then elevationCells: cell heights per unit on a crafted section', () => {
	// Loose sand 0.25 m, dense sand 1 m (common practice: fine cells in the liquefiable unit), 1 m elsewhere.
	const bands = unitHeightBands(strat, '2d', columns, [{ unitId: 'loose', cell: 0.25 }, { unitId: 'dense', cell: 1 }], -4);
	const cells = elevationCells(-4, 5, 1, bands);

	it('each unit’s band runs from its lowest to its highest elevation over the columns', () => {
		// Loose: from the ground (5) down to the lowest dense top among the columns (−0.75); dense: from its highest
		// top (0.75) down to the grid's bottom (−4).
		expect(bands).toEqual([
			{ bottom: -0.75, top: 5, cell: 0.25 },
			{ bottom: -4, top: 0.75, cell: 1 }
		]);
	});

	it('gives the expected centres: three cells of 3.25/3 m below −0.75, then 23 cells of 0.25 m', () => {
		expect(cells.edges.length).toBe(27);
		expect(cells.edges[3]).toBe(-0.75);
		expect(cells.centres[0]).toBeCloseTo(-4 + 3.25 / 6, 14);
		expect(cells.centres.slice(3, 6)).toEqual([-0.625, -0.375, -0.125]);
		expect(cells.centres[25]).toBe(4.875);
		for (let k = 3; k < 26; k++) expect(cells.edges[k + 1] - cells.edges[k]).toBe(0.25);
	});

	it('and the expected domains: the dense sand below its interpolated top, the loose sand above, in every column', () => {
		const zonation = [[{ unitId: 'loose', zone: -1 }], [{ unitId: 'dense', zone: -1 }]];
		const { domain } = axesDomains(strat, zonation, '2d', columns.map((c) => c.x), [0], cells.centres);
		const at = (column: number, z: number) => domain[column + 4 * cells.centres.indexOf(z)];
		// Column at ch 2.5 (dense top 0.75): the cell centred at 0.625 is dense, the one at 0.875 loose.
		expect([at(0, 0.625), at(0, 0.875)]).toEqual([1, 0]);
		// Column at ch 17.5 (dense top −0.75): every cell from −0.625 up is loose, those below dense.
		expect([at(3, -0.625), at(3, cells.centres[2])]).toEqual([0, 1]);
		// Nothing above the ground: the top cell (centre 4.875) is loose in every column.
		expect([0, 1, 2, 3].map((c) => at(c, 4.875))).toEqual([0, 0, 0, 0]);
		// The same reading at single points (an uploaded mesh's centroids).
		const p = pointDomains(strat, zonation, '2d', { x: [2.5, 17.5, 10, 10], y: [0, 0, 0, 0], z: [0.625, -0.625, 5.5, -3] });
		expect(Array.from(p.domain)).toEqual([1, 0, -1, 1]);
	});

	it('a unit given no height and absent units give no band', () => {
		expect(unitHeightBands(strat, '2d', columns, [{ unitId: 'nowhere', cell: 0.1 }], -4)).toEqual([]);
		expect(unitHeightBands(strat, '2d', [], [{ unitId: 'loose', cell: 0.1 }], -4)).toEqual([]);
	});
});
