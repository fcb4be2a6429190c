import { describe, it, expect } from 'vitest';
import { multigridStrides, multigridLevel, multigridPath, realizationStream } from '../../../src/lib/geostat/index';

describe('multigridStrides(reach, counts)', () => {
	it('multigridStrides doubles each axis up to a quarter of its reach: a 40-cell reach gives strides 1, 2, 4, 8', () => {
		// The bench section: 40 m / 1 m along x, 1 m / 0.25 m vertically (reach 4 cells, not coarsened), y a single cell.
		expect(Array.from(multigridStrides([40, Infinity, 4], [400, 1, 120]))).toEqual([1, 1, 1, 2, 1, 1, 4, 1, 1, 8, 1, 1]);
		// The bench block: 20 cells in plan, 6 vertically: strides 1, 2, 4 in plan only.
		expect(Array.from(multigridStrides([20, 20, 6], [100, 100, 100]))).toEqual([1, 1, 1, 2, 2, 1, 4, 4, 1]);
	});

	it('multigridStrides stops at the grid size, gives one level for a short reach, and rejects a negative reach', () => {
		expect(Array.from(multigridStrides([1000, 0, 0], [10, 1, 1]))).toEqual([1, 1, 1, 2, 1, 1, 4, 1, 1, 8, 1, 1]);
		expect(Array.from(multigridStrides([7, 7, 7], [50, 50, 50]))).toEqual([1, 1, 1]);
		expect(() => multigridStrides([-1, 4, 4], [10, 10, 10])).toThrow(RangeError);
		expect(() => multigridStrides([NaN, 4, 4], [10, 10, 10])).toThrow(RangeError);
	});
});

describe('multigridLevel(strides, i, j, k)', () => {
	it('multigridLevel is the coarsest level whose strides divide the cell indices', () => {
		const s = multigridStrides([40, 0, 4], [400, 1, 120]);
		expect([0, 1, 2, 4, 6, 8, 16, 24].map((i) => multigridLevel(s, i, 0, 3))).toEqual([3, 0, 1, 2, 1, 3, 3, 3]);
		const b = multigridStrides([20, 20, 6], [100, 100, 100]);
		expect([multigridLevel(b, 4, 8, 5), multigridLevel(b, 4, 2, 5), multigridLevel(b, 4, 3, 0)]).toEqual([2, 1, 0]);
	});
});

describe('multigridPath(nodes, level, rand)', () => {
	const nodes = Int32Array.from({ length: 200 }, (_, i) => 1000 + i);
	const level = Uint8Array.from(nodes, (_, i) => (i % 8 === 0 ? 3 : i % 4 === 0 ? 2 : i % 2 === 0 ? 1 : 0));

	it('multigridPath visits every node once, coarsest level first, each level shuffled', () => {
		const path = multigridPath(nodes, level, realizationStream('mg', 0, 0));
		expect(Array.from(path).sort((a, b) => a - b)).toEqual(Array.from(nodes));
		const lv = Array.from(path, (g) => level[g - 1000]);
		for (let p = 1; p < lv.length; p++) expect(lv[p]).toBeLessThanOrEqual(lv[p - 1]);
		expect(lv.filter((l) => l === 3).length).toBe(25);
		// Shuffled within a level: the finest level's 100 nodes are not in ascending order.
		const fine = Array.from(path).slice(100);
		expect(fine).not.toEqual([...fine].sort((a, b) => a - b));
	});

	it('multigridPath repeats for the same stream, differs for another, and does not mutate its inputs', () => {
		const before = Array.from(nodes);
		const a = multigridPath(nodes, level, realizationStream('mg', 4, 1));
		expect(Array.from(multigridPath(nodes, level, realizationStream('mg', 4, 1)))).toEqual(Array.from(a));
		expect(Array.from(multigridPath(nodes, level, realizationStream('mg', 5, 1)))).not.toEqual(Array.from(a));
		expect(Array.from(nodes)).toEqual(before);
	});

	it('multigridPath with one level is a Fisher–Yates shuffle of the nodes; empty input gives an empty path; lengths must match', () => {
		const flat = new Uint8Array(nodes.length);
		const path = multigridPath(nodes, flat, realizationStream('s', 0, 0));
		// The same draws as the random path's shuffle (simulate): Fisher–Yates from the end.
		const rand = realizationStream('s', 0, 0);
		const ref = Array.from(nodes);
		for (let i = ref.length - 1; i > 0; i--) {
			const j = Math.floor(rand() * (i + 1));
			[ref[i], ref[j]] = [ref[j], ref[i]];
		}
		expect(Array.from(path)).toEqual(ref);
		expect(multigridPath(new Int32Array(0), new Uint8Array(0), () => 0.5).length).toBe(0);
		expect(() => multigridPath(nodes, new Uint8Array(3), () => 0.5)).toThrow(RangeError);
	});
});
