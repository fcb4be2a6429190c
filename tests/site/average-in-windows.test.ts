import { describe, expect, it } from 'vitest';
import { mean, median } from 'simple-statistics';
import { averageInWindows } from '../../src/lib/site/index';
import { expectAbsClose, expectAllAbsClose } from '../asserts';

describe('averageInWindows(elevation, value, h, averaging)', () => {
	it('averageInWindows(z, v, h, "median") differs from the mean on a skewed window (worked by hand)', () => {
		const z = [-0.05, -0.1, -0.15, -0.25];
		const v = [1, 2, 9, 4];
		const m = averageInWindows(z, v, 0.2, 'mean');
		const md = averageInWindows(z, v, 0.2, 'median');
		expectAllAbsClose(m.value, [4, 4], 1e-12, 'mean');
		expectAllAbsClose(md.value, [2, 4], 1e-12, 'median');
		expect(m.count).toEqual([3, 1]);
		expectAbsClose(m.z[0], -0.1, 1e-12, 'mean elevation');
		// simple-statistics agrees on the window of three.
		expectAbsClose(md.value[0], median([1, 2, 9]), 0, 'median vs simple-statistics');
		expectAbsClose(m.value[0], mean([1, 2, 9]), 1e-12, 'mean vs simple-statistics');
	});

	it('averageInWindows(z, v, h, a) keeps a reading on a window edge in the upper window despite rounding', () => {
		// 0.3 / 0.1 = 2.9999999999999996 in floating point; the reading at 0.3 still opens window 3.
		const r = averageInWindows([0.3, 0.25], [1, 2], 0.1, 'mean');
		expect(r.count).toEqual([1, 1]);
	});

	it('averageInWindows(z, v, h, a) handles empty input and rejects bad arguments', () => {
		expect(averageInWindows([], [], 1, 'mean')).toEqual({ z: [], value: [], count: [] });
		expect(() => averageInWindows([1], [1], 0, 'mean')).toThrow('cell height');
		expect(() => averageInWindows([1], [1, 2], 1, 'mean')).toThrow(RangeError);
		expect(() => averageInWindows([1], [1], 1, 'mode' as 'mean')).toThrow('mean or median');
	});
});
