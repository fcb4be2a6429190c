import { describe, expect, it } from 'vitest';
import { axisCount, cellsPerDomain, domainRuns, gridDefinition, gridDomains, gridStratigraphy, targetsOf, type GridSpec, type GridStratigraphy } from './grid-fixtures';

// A crafted section (all elevations in m): clay from the ground down, sand below it, dense sand at depth.
//   S1 ch 0:  ground 5, clay 5, sand 2,       dense −4
//   S2 ch 20: ground 4, clay 4, sand absent,  dense −3   (the sand pinches out here)
//   S3 ch 40: ground 6, clay 6, sand 1,       dense not reached (S3 stops above it)
// An inclined zone boundary splits the sand: from (ch 10, el 2) down to (ch 0, el −4), so at elevation z it lies
// at ch 10 − 10·(2 − z)/6. Domains: 0 = clay (whole unit), 1 = sand east of the boundary (zone 1); the sand
// west of it (zone 0) and the dense sand are in no domain.
const strat: GridStratigraphy = gridStratigraphy({
	sectionLine: null,
	soundings: [
		{ id: 's1', name: 'S1', chainage: 0, x: null, y: null, groundElevation: 5 },
		{ id: 's2', name: 'S2', chainage: 20, x: null, y: null, groundElevation: 4 },
		{ id: 's3', name: 'S3', chainage: 40, x: null, y: null, groundElevation: 6 },
		{ id: 's4', name: 'S4 (no chainage)', chainage: null, x: null, y: null, groundElevation: 9 }
	],
	units: [
		{ id: 'clay', name: 'Clay' },
		{ id: 'sand', name: 'Sand' },
		{ id: 'dense', name: 'Dense' }
	],
	contacts: [
		{ soundingId: 's1', unitId: 'clay', topElevation: 5 },
		{ soundingId: 's1', unitId: 'sand', topElevation: 2 },
		{ soundingId: 's1', unitId: 'dense', topElevation: -4 },
		{ soundingId: 's2', unitId: 'clay', topElevation: 4 },
		{ soundingId: 's2', unitId: 'dense', topElevation: -3 },
		{ soundingId: 's3', unitId: 'clay', topElevation: 6 },
		{ soundingId: 's3', unitId: 'sand', topElevation: 1 }
	],
	boundaries: [{ unitId: 'sand', chainageTop: 10, elevationTop: 2, chainageBottom: 0, elevationBottom: -4 }]
});
const zonation = [[{ unitId: 'clay', zone: -1 }], [{ unitId: 'sand', zone: 1 }]];
// Cells 2 m wide and 0.5 m tall: centres at ch 1, 3, …, 39 and el −5.75, −5.25, …, 6.75.
const spec: GridSpec = { geometry: '2d', chainage: { from: 0, to: 40, cell: 2 }, elevation: { from: -6, to: 7, cell: 0.5 } };
const { grid, domain, warnings } = gridDomains(strat, zonation, spec);
const at = (c: number, z: number) => domain[(c - 1) / 2 + grid.counts.x * ((z + 5.75) / 0.5)];

describe('gridDefinition(spec) and axisCount(axis)', () => {
	it('gridDefinition puts the first cell centre half a cell in; 2D has y = 0 and one cell along it', () => {
		expect(grid).toEqual({ origin: { x: 1, y: 0, z: -5.75 }, spacing: { x: 2, y: 1, z: 0.5 }, counts: { x: 20, y: 1, z: 26 } });
		expect(gridDefinition({ geometry: '3d', x: { from: 10, to: 20, cell: 5 }, y: { from: 0, to: 3, cell: 1 }, elevation: { from: -1, to: 0, cell: 0.25 } })).toEqual({
			origin: { x: 12.5, y: 0.5, z: -0.875 },
			spacing: { x: 5, y: 1, z: 0.25 },
			counts: { x: 2, y: 3, z: 4 }
		});
	});
	it('axisCount covers the axis, forgives decimal noise, and refuses bad axes', () => {
		expect(axisCount({ from: 0, to: 401, cell: 2 })).toBe(201);
		expect(axisCount({ from: 0, to: 0.3, cell: 0.1 })).toBe(3);
		expect(() => gridDefinition({ ...spec, elevation: { from: 1, to: 1, cell: 0.5 } } as GridSpec)).toThrow(RangeError);
		expect(() => gridDefinition({ ...spec, chainage: { from: 0, to: 10, cell: 0 } } as GridSpec)).toThrow('cell sizes must be > 0');
	});
});

describe('gridDomains(stratigraphy, zonation, spec) on a crafted section', () => {
	it('cells above the ground surface, interpolated along chainage, are not simulated', () => {
		// Ground at ch 39: 4 + (6 − 4)·19/20 = 5.9; at ch 1: 5 − 1/20 = 4.95.
		expect(at(39, 5.75)).toBe(0);
		expect(at(39, 6.25)).toBe(-1);
		expect(at(1, 4.75)).toBe(0);
		expect(at(1, 5.25)).toBe(-1);
	});

	it('contacts are linear between soundings; a cell takes the unit whose top is nearest at or above it', () => {
		// Sand top between S2 (pinched out onto the dense sand, −3) and S3 (1): at ch 31, −3 + 4·11/20 = −0.8.
		expect(at(31, -0.75)).toBe(0);
		expect(at(31, -1.25)).toBe(1);
	});

	it('the sand pinches out at S2: it thins linearly towards the dense sand top there instead of ending at S1', () => {
		// At ch 19 the sand lies between 2 + (−3 − 2)·19/20 = −2.75 and the dense top −4 + 19/20 = −3.05.
		expect(at(19, -2.25)).toBe(0);
		expect(at(19, -2.75)).toBe(1);
		expect(at(19, -3.25)).toBe(-1);
		// Had the sand ended at S1 (the section draws no line where a unit is absent), ch 19 would be clay down to the dense sand.
	});

	it('the inclined zone boundary splits one column of sand by each cell’s own elevation', () => {
		// Column ch 5: sand from 2 − 5·5/20 = 0.75 down to the dense top −4 + 5/20 = −3.75 (a centre on a contact is in
		// the unit below it). The boundary lies at ch 5 where 10 − 10·(2 − z)/6 = 5, i.e. z = −1: above it zone 0 (no
		// domain), at and below it zone 1.
		for (const z of [0.75, 0.25, -0.25, -0.75]) expect(at(5, z), `el ${z}`).toBe(-1);
		for (const z of [-1.25, -1.75, -2.25, -2.75, -3.25]) expect(at(5, z), `el ${z}`).toBe(1);
		expect(at(5, 1.25)).toBe(0);
		expect(at(5, -3.75)).toBe(-1);
	});

	it('the dense sand, in no domain, is not simulated; S3, which stops above it, does not shape it', () => {
		// Dense top from S1 and S2 only: −3 beyond S2, so at ch 39 the cell at −3.25 is dense and the one at −2.75 is sand.
		expect(at(39, -3.25)).toBe(-1);
		expect(at(39, -2.75)).toBe(1);
	});

	it('a sounding without a chainage is left out and named', () => {
		expect(warnings).toEqual(['S4 (no chainage) has no chainage and does not shape the grid.']);
	});

	it('domainRuns and cellsPerDomain summarise the cells; the runs expand back to the domains', () => {
		const runs = domainRuns(domain);
		expect(runs.reduce((s, r) => s + r[1], 0)).toBe(domain.length);
		const back = runs.flatMap(([d, n]) => Array<number>(n).fill(d));
		expect(back).toEqual(Array.from(domain));
		const counts = cellsPerDomain(domain, 2);
		expect(counts[0] + counts[1]).toBe(Array.from(domain).filter((d) => d >= 0).length);
		expect(counts.every((c) => c > 0)).toBe(true);
	});

	it('cell centres are the engine targets: the grid expands to origin + index·spacing', () => {
		const t = targetsOf(grid, domain);
		expect(t.x[0]).toBe(1);
		expect(t.z[grid.counts.x]).toBe(-5.25);
		expect(Array.from(t.domain)).toEqual(Array.from(domain));
	});
});

describe('gridStratigraphy(parts)', () => {
	it('takes the top unit from the ground surface where no top is stored for it (effectiveTops), interpolated contacts as stored', () => {
		const g = gridStratigraphy({
			sectionLine: null,
			soundings: [{ id: 'a', name: 'A', chainage: 0, x: null, y: null, groundElevation: 4 }],
			units: [
				{ id: 'top', name: 'Top' },
				{ id: 'mid', name: 'Mid' },
				{ id: 'low', name: 'Low' }
			],
			contacts: [{ soundingId: 'a', unitId: 'mid', topElevation: 1.5, interpolated: true }],
			boundaries: []
		});
		expect(g.stations[0].tops).toEqual([4, 1.5, NaN]);
	});
});

describe('gridDomains in 3D', () => {
	// Three soundings in plan; one unit of 2 m over a second; the top unit is zoned along a section line y = 0.
	const s3 = gridStratigraphy({
		sectionLine: [
			[0, 0],
			[100, 0]
		],
		soundings: [
			{ id: 'a', name: 'A', chainage: null, x: 0, y: 0, groundElevation: 0 },
			{ id: 'b', name: 'B', chainage: null, x: 40, y: 0, groundElevation: 4 },
			{ id: 'c', name: 'C', chainage: null, x: 0, y: 40, groundElevation: 0 }
		],
		units: [
			{ id: 'top', name: 'Top' },
			{ id: 'base', name: 'Base' }
		],
		contacts: ['a', 'b', 'c'].flatMap((id) => [
			{ soundingId: id, unitId: 'top', topElevation: id === 'b' ? 4 : 0 },
			{ soundingId: id, unitId: 'base', topElevation: id === 'b' ? 2 : -2 }
		]),
		boundaries: [{ unitId: 'top', chainageTop: 20, elevationTop: 10, chainageBottom: 20, elevationBottom: -10 }]
	});
	const spec3: GridSpec = { geometry: '3d', x: { from: 0, to: 40, cell: 10 }, y: { from: 0, to: 40, cell: 10 }, elevation: { from: -3, to: 5, cell: 1 } };

	it('surfaces are linear over the soundings’ triangle; zones count along the section line; cells above ground are −1', () => {
		const { grid: g, domain: d } = gridDomains(s3, [[{ unitId: 'top', zone: 0 }], [{ unitId: 'top', zone: 1 }], [{ unitId: 'base', zone: -1 }]], spec3);
		const cell = (x: number, y: number, z: number) => d[(x - 5) / 10 + 4 * ((y - 5) / 10 + 4 * (z + 2.5))];
		expect(g.counts).toEqual({ x: 4, y: 4, z: 8 });
		// Ground at (15, 5): barycentric in the triangle A, B, C: 4·15/40 = 1.5.
		expect(cell(15, 5, 1.5)).toBe(0);
		expect(cell(15, 5, 2.5)).toBe(-1);
		expect(cell(15, 5, 0.5)).toBe(0);
		// The base's top there: −2 + 4·15/40 = −0.5.
		expect(cell(15, 5, -0.5)).toBe(2);
		expect(cell(15, 5, -1.5)).toBe(2);
		// Chainage of (25, 5) on the line y = 0 is 25, east of the boundary at 20: zone 1.
		expect(cell(25, 5, 1.5)).toBe(1);
	});

	it('without a section line, cells of a zoned unit cannot be zoned and are not simulated (with a warning)', () => {
		const { domain: d, warnings: w } = gridDomains({ ...s3, sectionLine: null }, [[{ unitId: 'top', zone: 0 }], [{ unitId: 'base', zone: -1 }]], spec3);
		expect(Array.from(d).includes(0)).toBe(false);
		expect(Array.from(d).includes(1)).toBe(true);
		expect(w.some((m) => /section line/.test(m))).toBe(true);
	});
});
