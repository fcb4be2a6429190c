// The weak-zone panel's figures of one endpoint answer: the stochastic summary (P10/P50/P90 of the largest
// extent at the midpoint plotting positions, medians) and a uniform baseline field by field, one a percentile.
import { describe, expect, it } from 'vitest';
import type { WeakZonesJson } from '../../../../../src/lib/api/index';
import { figuresOf } from '../../../../../src/routes/projects/[id]/simulations/weak-zones.svelte';

const answer = (rows: [number, number, number, boolean | null][]): WeakZonesJson => ({
	property: 'qc1Ncs',
	threshold: 100,
	minLength: 20,
	domains: [1],
	realizations: rows.map(([zones, largestExtent, largestArea, crossesBoundary], realization) => ({ realization, zones, largestExtent, largestArea, crossesBoundary })),
	crossingProbability: rows[0][3] === null ? null : rows.filter((r) => r[3]).length / rows.length,
	probabilityMap: [null, 0, 1 / 3]
});

describe('figuresOf(answer, percentiles?)', () => {
	it('summarises a stochastic recipe: extent quantiles at (j − ½)/N, median zones and area, crossings counted, null map cells NaN', () => {
		const f = figuresOf(answer([[3, 10, 4, false], [1, 30, 9, true], [2, 20, 6, false], [5, 40, 2, true]]));
		// Sorted extents 10, 20, 30, 40 at positions 0.125, 0.375, 0.625, 0.875: P10 below the first holds it, P50 halfway, P90 the last.
		expect(f.extent).toEqual({ p10: 10, p50: 25, p90: 40 });
		expect([f.zones, f.area, f.crossing, f.crossings, f.realizations]).toEqual([2.5, 5, 0.5, 2, 4]);
		expect(Array.from(f.map)).toEqual([NaN, 0, 1 / 3]);
		expect(f.byPercentile).toBeUndefined();
	});

	it('gives a uniform baseline’s figures field by field, each with its percentile; with no boundary its crossings are null', () => {
		const f = figuresOf(answer([[1, 200, 900, null], [0, 0, 0, null], [0, 0, 0, null]]), [33, 50, 67]);
		expect(f.byPercentile).toEqual([
			{ percentile: 33, extent: 200, zones: 1, area: 900, crosses: null },
			{ percentile: 50, extent: 0, zones: 0, area: 0, crosses: null },
			{ percentile: 67, extent: 0, zones: 0, area: 0, crosses: null }
		]);
		expect(f.crossing).toBeNull();
	});

	it('leaves byPercentile out when the percentiles do not match the realizations one for one', () => {
		expect(figuresOf(answer([[1, 5, 1, false], [1, 5, 1, false]]), [50]).byPercentile).toBeUndefined();
	});
});
