import { describe, expect, it } from 'vitest';
import { weightedQuantiles } from '../../src/lib/geostat/index';
import { weightedCdf } from '../../src/lib/site/index';
import { expectAllAbsClose } from '../asserts';

describe('weightedCdf(values, weights)', () => {
	it('weightedCdf(values, w) sorts values and places each at the midpoint of its step', () => {
		const c = weightedCdf([3, 1, 2], [1, 1, 1]);
		expect(c.value).toEqual([1, 2, 3]);
		expectAllAbsClose(c.p, [1 / 6, 1 / 2, 5 / 6], 1e-15, 'p');
	});

	it('weightedCdf(values, w) merges duplicates, normalises weights and skips zero weights', () => {
		// Weights 1, 1, 2 (total 4): value 5 holds 2/4 → p 0.25; value 7 holds 2/4 → p 0.75.
		const c = weightedCdf([5, 7, 5, 9], [1, 2, 1, 0]);
		expect(c.value).toEqual([5, 7]);
		expectAllAbsClose(c.p, [0.25, 0.75], 1e-15, 'p');
		expect(weightedCdf([], [])).toEqual({ value: [], p: [] });
		expect(() => weightedCdf([1], [])).toThrow(RangeError);
	});

	it('weightedCdf(values, w) shares its points with weightedQuantiles, so P50 read off the curve is the P50 of the table', () => {
		const values = [12, 7, 3.5, 19, 8, 8, 1, 15.25];
		const w = [0.2, 0.05, 0.1, 0.15, 0.1, 0.1, 0.2, 0.1];
		const c = weightedCdf(values, w);
		expect(Array.from(weightedQuantiles(values, w, c.p))).toEqual(c.value);
		const k = c.p.findIndex((p) => p >= 0.5);
		const readOff = c.value[k - 1] + ((c.value[k] - c.value[k - 1]) * (0.5 - c.p[k - 1])) / (c.p[k] - c.p[k - 1]);
		expect(readOff).toBe(weightedQuantiles(values, w, [0.5])[0]);
	});
});
