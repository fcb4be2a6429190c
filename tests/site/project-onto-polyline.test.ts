import { describe, expect, it } from 'vitest';
import { checkPolyline, planDistance, polylineLength, projectOntoPolyline } from '../../src/lib/site/index';
import { L } from './fixtures';
import { SECTION_LINE, scenarioSoundings } from '../../src/lib/server/scenario/levee';
import { expectAbsClose, expectRelClose } from '../asserts';

describe('projectOntoPolyline(line, x, y)', () => {
	it('projectOntoPolyline(line, x, y) gives chainage and a right-positive offset on the first segment', () => {
		// Looking along +x, the point at y = −10 is 10 to the right.
		const p = projectOntoPolyline(L, 50, -10);
		expect(p.segment).toBe(0);
		expectAbsClose(p.chainage, 50, 1e-12, 'chainage');
		expectAbsClose(p.offset, 10, 1e-12, 'offset');
	});

	it('projectOntoPolyline(line, x, y) adds the lengths of earlier segments', () => {
		// Second segment runs along +y from (100, 0); x = 110 is 10 to its right; 100 + 50 along.
		const p = projectOntoPolyline(L, 110, 50);
		expect(p.segment).toBe(1);
		expectAbsClose(p.chainage, 150, 1e-12, 'chainage');
		expectAbsClose(p.offset, 10, 1e-12, 'offset');
		const left = projectOntoPolyline(L, 90, 50);
		expectAbsClose(left.offset, -10, 1e-12, 'left offset');
	});

	it('projectOntoPolyline(line, x, y) extends the end segments (negative chainage before the start)', () => {
		const before = projectOntoPolyline(L, -20, 5);
		expectAbsClose(before.chainage, -20, 1e-12, 'chainage');
		expectAbsClose(before.offset, -5, 1e-12, 'offset');
		const after = projectOntoPolyline(L, 100, 130);
		expectAbsClose(after.chainage, 230, 1e-12, 'chainage');
		expect(after.offset).toBe(0);
	});

	it('projectOntoPolyline(line, x, y) outside a corner goes to the vertex; the earlier segment wins a tie', () => {
		// (120, −20) is √800 from the vertex (100, 0), equally far from both segments.
		const p = projectOntoPolyline(L, 120, -20);
		expect(p.segment).toBe(0);
		expectAbsClose(p.chainage, 100, 1e-12, 'chainage');
		expectAbsClose(p.offset, Math.sqrt(800), 1e-12, 'offset');
	});

	it('projectOntoPolyline(line, x, y) skips zero-length segments and handles huge coordinates', () => {
		const dup: [number, number][] = [
			[0, 0],
			[0, 0],
			[3, 4]
		];
		const p = projectOntoPolyline(dup, 3, 4);
		expectAbsClose(p.chainage, 5, 1e-12, 'chainage');
		const far: [number, number][] = [
			[5e6, 5e6],
			[5e6 + 10, 5e6]
		];
		const q = projectOntoPolyline(far, 5e6 + 4, 5e6 + 3);
		expectAbsClose(q.chainage, 4, 1e-9, 'chainage');
		expectAbsClose(q.offset, -3, 1e-9, 'offset');
	});

	it('projectOntoPolyline(line, x, y) rejects a degenerate line and non-finite points', () => {
		expect(() => projectOntoPolyline([[1, 1]], 0, 0)).toThrow(RangeError);
		expect(() => projectOntoPolyline([[1, 1], [1, 1]], 0, 0)).toThrow('two distinct points');
		expect(() => projectOntoPolyline(L, NaN, 0)).toThrow('finite');
		expect(() => projectOntoPolyline([[0, 0], [NaN, 1]], 0, 0)).toThrow(RangeError);
	});

	it('projectOntoPolyline(line, x, y) recovers the demo scenario chainages and offsets', () => {
		const b = (SECTION_LINE.bearing * Math.PI) / 180;
		const line: [number, number][] = [
			[SECTION_LINE.start.x, SECTION_LINE.start.y],
			[SECTION_LINE.start.x + SECTION_LINE.length * Math.sin(b), SECTION_LINE.start.y + SECTION_LINE.length * Math.cos(b)]
		];
		for (const s of scenarioSoundings()) {
			const p = projectOntoPolyline(line, s.x, s.y);
			// Coordinates are rounded to 0.01 m, so chainage and offset agree within 0.01 m.
			expectAbsClose(p.chainage, s.chainage, 0.01, `${s.id} chainage`);
			expectAbsClose(p.offset, s.offset, 0.01, `${s.id} offset`);
		}
	});
});

describe('polylineLength(line) and checkPolyline(line)', () => {
	it('polylineLength(line) sums segment lengths', () => {
		expect(polylineLength(L)).toBe(200);
		expect(polylineLength([])).toBe(0);
	});

	it('checkPolyline(line) accepts two distinct points and says what is wrong otherwise', () => {
		expect(() => checkPolyline(L)).not.toThrow();
		expect(() => checkPolyline([[0, 0]])).toThrow('two distinct points');
		expect(() => checkPolyline([[1, 1], [1, 1]])).toThrow('two distinct points');
		expect(() => checkPolyline([[0, 0], [1, NaN]])).toThrow('finite coordinates');
		expect(() => checkPolyline('0,0;1,1' as never)).toThrow('list of points');
	});
});

describe('planDistance(dx, dy)', () => {
	it('planDistance(dx, dy) is √(dx² + dy²): exact on Pythagorean triples, symmetric in sign and order', () => {
		expect(planDistance(3, 4)).toBe(5);
		expect(planDistance(-4, 3)).toBe(5);
		expect(planDistance(0, 0)).toBe(0);
		expect(planDistance(0, -7)).toBe(7);
	});

	it('planDistance(dx, dy) neither overflows nor underflows where dx² would', () => {
		// dx² = 1e320 overflows to Infinity and 1e-320 underflows; scaling by the larger keeps both finite.
		expectRelClose(planDistance(3e160, 4e160), 5e160, 1e-15);
		expectRelClose(planDistance(3e-170, 4e-170), 5e-170, 1e-15);
	});

	it('planDistance(dx, dy) passes NaN and Infinity through', () => {
		expect(planDistance(NaN, 1)).toBeNaN();
		expect(planDistance(Infinity, 1)).toBe(Infinity);
	});

	it('projectOntoPolyline(line, x, y) is total for a point at 1e160: a finite chainage along the line', () => {
		const p = projectOntoPolyline(L, 0, 1e160);
		expect(Number.isFinite(p.offset)).toBe(true);
	});
});
