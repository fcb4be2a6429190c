import { describe, expect, it } from 'vitest';
import {
	boundaryChainageAt,
	interpolateAlongChainage,
	triangulatedSurface,
	zoneNamesOf,
	zoneOf
} from '../../../src/lib/server/services/stratigraphy';
import { expectAbsClose } from '../../asserts';

describe('interpolateAlongChainage(stations, chainage)', () => {
	const stations = [
		{ chainage: 100, value: 2 },
		{ chainage: 0, value: 1 },
		{ chainage: 150, value: -2 }
	];

	it('interpolateAlongChainage(stations, c) is linear between neighbours (unsorted input)', () => {
		// Between 0 (1) and 100 (2): at 25, 1 + 0.25·1 = 1.25; between 100 (2) and 150 (−2): at 125, 2 − 0.5·4 = 0.
		expectAbsClose(interpolateAlongChainage(stations, 25), 1.25, 1e-12, 'c = 25');
		expectAbsClose(interpolateAlongChainage(stations, 125), 0, 1e-12, 'c = 125');
	});

	it('interpolateAlongChainage(stations, c) is exact at a station and constant beyond the ends', () => {
		expect(interpolateAlongChainage(stations, 100)).toBe(2);
		expect(interpolateAlongChainage(stations, -50)).toBe(1);
		expect(interpolateAlongChainage(stations, 1e9)).toBe(-2);
	});

	it('interpolateAlongChainage(stations, c) is NaN next to a sounding where the unit is absent', () => {
		const gap = [
			{ chainage: 0, value: 1 },
			{ chainage: 10, value: NaN },
			{ chainage: 20, value: 3 }
		];
		expect(interpolateAlongChainage(gap, 5)).toBeNaN();
		expect(interpolateAlongChainage(gap, 15)).toBeNaN();
		expect(interpolateAlongChainage(gap, 20)).toBe(3);
	});

	it('interpolateAlongChainage(stations, c) keeps the first of duplicate chainages and handles one station', () => {
		const dup = [
			{ chainage: 0, value: 0 },
			{ chainage: 10, value: 5 },
			{ chainage: 10, value: 7 },
			{ chainage: 20, value: 10 }
		];
		expect(interpolateAlongChainage(dup, 10)).toBe(5);
		expectAbsClose(interpolateAlongChainage(dup, 15), 7.5, 1e-12, 'after the duplicate');
		expect(interpolateAlongChainage([{ chainage: 3, value: 4 }], -1)).toBe(4);
	});

	it('interpolateAlongChainage(stations, c) rejects no stations and non-finite chainages', () => {
		expect(() => interpolateAlongChainage([], 0)).toThrow('no stations');
		expect(() => interpolateAlongChainage(stations, NaN)).toThrow(RangeError);
		expect(() => interpolateAlongChainage([{ chainage: Infinity, value: 1 }], 0)).toThrow(RangeError);
	});
});

describe('triangulatedSurface(points)', () => {
	// A plane z = 1 + 2x − y through four corners of a square and its centre: linear on every triangle,
	// so barycentric interpolation must reproduce it exactly (up to rounding).
	const plane = (x: number, y: number) => 1 + 2 * x - y;
	const corners = [
		[0, 0],
		[10, 0],
		[10, 10],
		[0, 10],
		[5, 5]
	].map(([x, y]) => ({ x, y, value: plane(x, y) }));

	it('triangulatedSurface(points) reproduces a plane inside the hull', () => {
		const f = triangulatedSurface(corners);
		for (const [x, y] of [
			[1, 1],
			[9, 2],
			[3.3, 7.7],
			[10, 5],
			[0, 0]
		]) {
			expectAbsClose(f(x, y), plane(x, y), 1e-12, `(${x}, ${y})`);
		}
	});

	it('triangulatedSurface(points) interpolates a single triangle by barycentric weights (worked by hand)', () => {
		// Triangle (0,0)=0, (4,0)=4, (0,4)=8: at (1,1) weights are ½, ¼, ¼ → 0·½ + 4·¼ + 8·¼ = 3.
		const f = triangulatedSurface([
			{ x: 0, y: 0, value: 0 },
			{ x: 4, y: 0, value: 4 },
			{ x: 0, y: 4, value: 8 }
		]);
		expectAbsClose(f(1, 1), 3, 1e-12, 'centre-ish');
	});

	it('triangulatedSurface(points) takes the nearest point outside the hull', () => {
		const f = triangulatedSurface(corners);
		expect(f(30, 31)).toBe(plane(10, 10));
		expect(f(-5, -1)).toBe(plane(0, 0));
	});

	it('triangulatedSurface(points) gives NaN on triangles touching a point where the unit is absent', () => {
		const pts = corners.map((p) => (p.x === 5 ? { ...p, value: NaN } : p));
		const f = triangulatedSurface(pts);
		expect(f(5, 4)).toBeNaN();
	});

	it('triangulatedSurface(points) falls back to interpolation along the line for collinear points', () => {
		const f = triangulatedSurface([
			{ x: 0, y: 0, value: 0 },
			{ x: 3, y: 4, value: 10 },
			{ x: 6, y: 8, value: 30 }
		]);
		// Halfway between the 2nd and 3rd points along the line: 20; off the line it projects onto it.
		expectAbsClose(f(4.5, 6), 20, 1e-12, 'on the line');
		expectAbsClose(f(4.5 + 4, 6 - 3), 20, 1e-12, 'projected onto the line');
	});

	it('triangulatedSurface(points) handles one point, duplicates and huge map coordinates', () => {
		expect(triangulatedSurface([{ x: 1, y: 1, value: 7 }])(100, -3)).toBe(7);
		const dup = triangulatedSurface([...corners, { x: 0, y: 0, value: 999 }]);
		expectAbsClose(dup(0, 0), plane(0, 0), 1e-12, 'first of duplicates');
		const E = 512_000;
		const N = 4_183_000;
		const big = triangulatedSurface(corners.map((p) => ({ x: p.x + E, y: p.y + N, value: p.value })));
		expectAbsClose(big(E + 3, N + 2), plane(3, 2), 1e-6, 'map coordinates');
	});

	it('triangulatedSurface(points) rejects no points and non-finite coordinates', () => {
		expect(() => triangulatedSurface([])).toThrow('no points');
		expect(() => triangulatedSurface([{ x: NaN, y: 0, value: 1 }])).toThrow(RangeError);
	});
});

describe('zoneOf(boundaries, chainage, elevation)', () => {
	const vertical = { chainageTop: 205, elevationTop: 5, chainageBottom: 205, elevationBottom: -12 };
	// Inclined: from (100, 0) at the top to (110, −10) at the bottom, so at elevation −5 it sits at chainage 105.
	const inclined = { chainageTop: 100, elevationTop: 0, chainageBottom: 110, elevationBottom: -10 };

	it('zoneOf(boundaries, c, z) is 0 without boundaries', () => {
		expect(zoneOf([], 123, -4)).toBe(0);
	});

	it('zoneOf(boundaries, c, z) splits at a vertical boundary; a point on it goes east', () => {
		expect(zoneOf([vertical], 204.99, 0)).toBe(0);
		expect(zoneOf([vertical], 205, 0)).toBe(1);
		expect(zoneOf([vertical], 300, -20)).toBe(1);
	});

	it('zoneOf(boundaries, c, z) follows an inclined boundary with elevation, extended beyond its ends', () => {
		expectAbsClose(boundaryChainageAt(inclined, -5), 105, 1e-12, 'chainage at −5');
		expect(zoneOf([inclined], 104, -5)).toBe(0);
		expect(zoneOf([inclined], 106, -5)).toBe(1);
		// Above its top the line continues up-dip: at +2 it is at chainage 98.
		expect(zoneOf([inclined], 99, 2)).toBe(1);
		expect(zoneOf([inclined], 97, 2)).toBe(0);
		// Below its bottom: at −20 it is at chainage 120.
		expect(zoneOf([inclined], 115, -20)).toBe(0);
	});

	it('zoneOf(boundaries, c, z) counts zones west to east whatever the order the boundaries are given in', () => {
		expect(zoneOf([vertical, inclined], 150, -5)).toBe(1);
		expect(zoneOf([vertical, inclined], 300, -5)).toBe(2);
		expect(zoneOf([inclined, vertical], 50, -5)).toBe(0);
	});

	it('zoneOf(boundaries, c, z) rejects non-finite coordinates', () => {
		expect(() => zoneOf([vertical], NaN, 0)).toThrow(RangeError);
	});

	it('zoneNamesOf(unit, n) uses stored names that fit, else numbered zones', () => {
		expect(zoneNamesOf({ name: 'Sand', zoneNames: ['West', 'East'] }, 1)).toEqual(['West', 'East']);
		expect(zoneNamesOf({ name: 'Sand', zoneNames: ['West'] }, 2)).toEqual(['West', 'Zone 2', 'Zone 3']);
		expect(zoneNamesOf({ name: 'Sand', zoneNames: null }, 0)).toEqual(['Sand']);
	});
});
