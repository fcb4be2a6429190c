import { describe, expect, it } from 'vitest';
import { triangulatedSurface } from '../../src/lib/site/index';
import { expectAbsClose } from '../asserts';

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
