import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { mean, variance, quantileSorted } from 'simple-statistics';
import { inverseNormalCdf, normalScore, weightedMean, weightedPlottingPositions, weightedVariance, weightedQuantiles } from '../../../src/lib/geostat/index';
import { expectAbsClose, expectAllAbsClose, expectRelClose } from '../../asserts';

describe('weightedMean / weightedVariance', () => {
	it('weightedMean and weightedVariance match a hand-computed example', () => {
		// Values 1, 2, 4 with weights 1, 1, 2: mean (1 + 2 + 8)/4 = 2.75;
		// variance (1·3.0625 + 1·0.5625 + 2·1.5625)/4 = 6.75/4 = 1.6875.
		expect(weightedMean([1, 2, 4], [1, 1, 2])).toBe(2.75);
		expect(weightedVariance([1, 2, 4], [1, 1, 2])).toBe(1.6875);
	});

	it('weightedMean and weightedVariance with equal weights equal simple-statistics mean and population variance (1e-12 relative)', () => {
		const rng = seedrandom('weighted-eq');
		const v = Array.from({ length: 1000 }, () => rng() * 50 - 10);
		expectRelClose(weightedMean(v), mean(v), 1e-12);
		expectRelClose(weightedVariance(v), variance(v), 1e-12);
		expectRelClose(weightedVariance(v, new Array(1000).fill(3)), variance(v), 1e-12);
	});

	it('weightedVariance is shift-invariant for large offsets (two-pass, 1e-6 relative at offset 1e9)', () => {
		const v = [1, 2, 3, 4].map((x) => x + 1e9);
		expectRelClose(weightedVariance(v), 1.25, 1e-6);
	});

	it('weightedMean of one value is that value; zero weights are allowed but not all of them', () => {
		expect(weightedMean([7])).toBe(7);
		expect(weightedVariance([7])).toBe(0);
		expect(weightedMean([1, 100], [1, 0])).toBe(1);
		expect(() => weightedMean([1, 2], [0, 0])).toThrow('weights must not all be 0');
		expect(() => weightedMean([])).toThrow('no values');
		expect(() => weightedMean([1, NaN])).toThrow('values must be finite');
		expect(() => weightedMean([1, 2], [1])).toThrow('weights length must match values');
		expect(() => weightedVariance([1, 2], [1, -1])).toThrow('weights must be >= 0');
		expect(() => weightedMean(3 as unknown as number[])).toThrow(TypeError);
	});
});

describe('weightedQuantiles(values, weights, ps)', () => {
	it('weightedQuantiles with equal weights is Hyndman & Fan (1996) definition 5, p = (i − ½)/n', () => {
		// Values 10, 20, 30, 40 sit at p = 0.125, 0.375, 0.625, 0.875; the median interpolates to 25.
		const q = weightedQuantiles([40, 10, 30, 20], undefined, [0, 0.125, 0.25, 0.5, 0.875, 1]);
		expect(Array.from(q)).toEqual([10, 10, 15, 25, 40, 40]);
	});

	it('weightedQuantiles matches a hand-computed weighted example', () => {
		// Weights 0.5, 0.3, 0.2 on values 1, 2, 3 → positions 0.25, 0.65, 0.9.
		// p = 0.45 is halfway between 0.25 and 0.65 → 1.5; p = 0.775 halfway between 0.65 and 0.9 → 2.5.
		const q = weightedQuantiles([3, 1, 2], [2, 5, 3], [0.25, 0.45, 0.775, 0.95]);
		expectAbsClose(q[0], 1, 0);
		expectAbsClose(q[1], 1.5, 1e-14);
		expectAbsClose(q[2], 2.5, 1e-14);
		expect(q[3]).toBe(3);
	});

	it('weightedQuantiles of large equal-weight samples is within one spacing of simple-statistics quantileSorted', () => {
		const rng = seedrandom('wq');
		const v = Array.from({ length: 2000 }, () => rng());
		const sorted = [...v].sort((a, b) => a - b);
		const ps = [0.1, 0.5, 0.9];
		const q = weightedQuantiles(v, undefined, ps);
		// Different plotting-position conventions differ by at most one order-statistic gap (~1/n here).
		ps.forEach((p, k) => expectAbsClose(q[k], quantileSorted(sorted, p), 3e-3, `p=${p}`));
	});

	it('weightedQuantiles merges ties, ignores zero weights and rejects bad probabilities', () => {
		expect(Array.from(weightedQuantiles([2, 2, 2], undefined, [0.1, 0.9]))).toEqual([2, 2]);
		expect(Array.from(weightedQuantiles([1, 5, 9], [1, 0, 1], [0.5]))).toEqual([5]);
		expect(() => weightedQuantiles([1], undefined, [1.1])).toThrow('probabilities must be in [0, 1]');
		expect(() => weightedQuantiles([1], undefined, [NaN])).toThrow(RangeError);
	});
});

describe('weightedPlottingPositions(values, weights)', () => {
	it('weightedPlottingPositions with equal weights puts the i-th of n at (i − ½)/n (Hyndman & Fan 1996, definition 5)', () => {
		const { values, p } = weightedPlottingPositions([40, 10, 30, 20]);
		expect(Array.from(values)).toEqual([10, 20, 30, 40]);
		expect(Array.from(p)).toEqual([0.125, 0.375, 0.625, 0.875]);
	});

	it('weightedPlottingPositions merges ties into one step, normalises weights and leaves zero weights out (worked by hand)', () => {
		// Weights 2, 5, 3 (sum 10) on 3, 1, 2: steps [0, .5], [.5, .8], [.8, 1] → midpoints .25, .65, .9.
		const { values, p } = weightedPlottingPositions([3, 1, 2, 1, 7], [2, 2.5, 3, 2.5, 0]);
		expect(Array.from(values)).toEqual([1, 2, 3]);
		expectAllAbsClose(p, [0.25, 0.65, 0.9], 1e-15);
	});

	it('weightedPlottingPositions are the positions normalScore scores: Φ⁻¹(p) equals the scores, bit for bit', () => {
		const v = [5.5, 1.25, 3, 3, 9, 0.5, 7];
		const w = [0.1, 0.3, 0.05, 0.15, 0.2, 0.12, 0.08];
		const { values, p } = weightedPlottingPositions(v, w);
		const { table } = normalScore(v, w);
		expect(Array.from(values)).toEqual(Array.from(table.values));
		expect(Array.from(p, inverseNormalCdf)).toEqual(Array.from(table.scores));
	});

	it('weightedQuantiles(values, w, ps) returns the data at their plotting positions and interpolates between them', () => {
		const v = [3, 1, 2];
		const w = [2, 5, 3];
		const { values, p } = weightedPlottingPositions(v, w);
		expect(Array.from(weightedQuantiles(v, w, p))).toEqual(Array.from(values));
	});

	it('weightedPlottingPositions rejects what weightedMean rejects', () => {
		expect(() => weightedPlottingPositions([])).toThrow('no values');
		expect(() => weightedPlottingPositions([1, NaN])).toThrow('values must be finite');
		expect(() => weightedPlottingPositions([1, 2], [1])).toThrow('weights length must match values');
		expect(() => weightedPlottingPositions([1, 2], [0, 0])).toThrow('weights must not all be 0');
	});
});
