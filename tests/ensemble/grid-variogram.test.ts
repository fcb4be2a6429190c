import { describe, it, expect } from 'vitest';
import { gridVariogram } from '../../src/lib/ensemble/index';

const counts = { x: 6, y: 1, z: 4 };
const spacing = { x: 2, y: 1, z: 0.5 };
const n = 24;

describe('gridVariogram(values, include, counts, spacing, axis, steps)', () => {
	it('gridVariogram of v = i along x is s²/2 exactly at h = s·dx, with (6 − s)·4 pairs', () => {
		const v = Float64Array.from({ length: n }, (_, p) => p % 6);
		const lags = gridVariogram(v, new Uint8Array(n).fill(1), counts, spacing, 'x', [1, 2, 5]);
		expect(lags.map((l) => [l.h, l.gamma, l.pairs])).toEqual([
			[2, 0.5, 20],
			[4, 2, 16],
			[10, 12.5, 4]
		]);
	});

	it('gridVariogram along z pairs cells of one column only; v = 3k gives 9s²/2', () => {
		const v = Float64Array.from({ length: n }, (_, p) => 3 * Math.floor(p / 6));
		const lags = gridVariogram(v, new Uint8Array(n).fill(1), counts, spacing, 'z', [1, 3]);
		expect(lags.map((l) => [l.h, l.gamma, l.pairs])).toEqual([
			[0.5, 4.5, 18],
			[1.5, 40.5, 6]
		]);
	});

	it('gridVariogram leaves out pairs with a cell outside the mask, and is NaN for a lag without pairs', () => {
		const v = Float64Array.from({ length: n }, (_, p) => p % 6);
		const mask = Uint8Array.from({ length: n }, (_, p) => (p % 6 === 0 ? 0 : 1));
		const [one, six] = gridVariogram(v, mask, counts, spacing, 'x', [1, 6]);
		expect(one.pairs).toBe(16);
		expect(six.pairs).toBe(0);
		expect(six.gamma).toBeNaN();
	});

	it('gridVariogram refuses mismatched sizes and step counts that are not positive integers', () => {
		expect(() => gridVariogram(new Float64Array(3), new Uint8Array(3), counts, spacing, 'x', [1])).toThrow(RangeError);
		expect(() => gridVariogram(new Float64Array(n), new Uint8Array(n), counts, spacing, 'x', [0])).toThrow('steps must be positive integers');
	});
});
