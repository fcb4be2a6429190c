import { describe, it, expect } from 'vitest';
import { mean, standardDeviation } from 'simple-statistics';
import seedrandom from 'seedrandom';
import { ENSEMBLE_STATS, ensembleMap } from '../../src/lib/ensemble/index';
import { weightedQuantiles } from '../../src/lib/geostat/index';
import { expectAbsClose, expectSameBits } from '../asserts';

function realizations(n: number, cells: number, seed = 'ens'): Float64Array[] {
	const rng = seedrandom.alea(seed);
	return Array.from({ length: n }, () => Float64Array.from({ length: cells }, () => 10 * rng() - 3));
}

describe('ensembleMap(realizations, stat, threshold)', () => {
	it("ensembleMap 'mean' and 'sd' agree with simple-statistics' mean and population standard deviation (within 1e-12)", () => {
		const rs = realizations(20, 50);
		const m = ensembleMap(rs, 'mean');
		const sd = ensembleMap(rs, 'sd');
		for (let i = 0; i < 50; i++) {
			const v = rs.map((r) => r[i]);
			expectAbsClose(m[i], mean(v), 1e-12, `mean[${i}]`);
			expectAbsClose(sd[i], standardDeviation(v), 1e-12, `sd[${i}]`);
		}
	});

	it("ensembleMap 'p10', 'p50', 'p90' are the engine's weightedQuantiles with equal weights (Hyndman & Fan 1996 def. 5; within 1e-12)", () => {
		for (const n of [1, 2, 5, 20, 37]) {
			const rs = realizations(n, 30, `q${n}`);
			const maps = { p10: ensembleMap(rs, 'p10'), p50: ensembleMap(rs, 'p50'), p90: ensembleMap(rs, 'p90') };
			for (let i = 0; i < 30; i++) {
				const [q10, q50, q90] = weightedQuantiles(rs.map((r) => r[i]), undefined, [0.1, 0.5, 0.9]);
				expectAbsClose(maps.p10[i], q10, 1e-12, `n=${n} p10[${i}]`);
				expectAbsClose(maps.p50[i], q50, 1e-12, `n=${n} p50[${i}]`);
				expectAbsClose(maps.p90[i], q90, 1e-12, `n=${n} p90[${i}]`);
			}
		}
	});

	it("ensembleMap 'p50' of 4 values is the mean of the middle two; p10 of 20 values lies midway between the 2nd and 3rd smallest", () => {
		expect(ensembleMap([[4], [1], [3], [2]].map((v) => Float64Array.from(v)), 'p50')[0]).toBe(2.5);
		const rs = Array.from({ length: 20 }, (_, r) => Float64Array.from([r * 10]));
		// Position 0.1·20 − ½ = 1.5 (0-based): halfway between 10 and 20.
		expect(ensembleMap(rs, 'p10')[0]).toBe(15);
		expect(ensembleMap(rs, 'p90')[0]).toBe(175);
	});

	it("ensembleMap 'below' is the fraction strictly below the threshold", () => {
		const rs = [[1, 5], [2, 5], [3, 5], [4, 6]].map((v) => Float64Array.from(v));
		expect(Array.from(ensembleMap(rs, 'below', 3))).toEqual([0.5, 0]);
		expect(Array.from(ensembleMap(rs, 'below', 5.5))).toEqual([1, 0.75]);
	});

	it('ensembleMap is NaN where a target is not simulated, and repeats bit for bit', () => {
		const rs = realizations(7, 10);
		for (const r of rs) r[3] = NaN;
		for (const stat of ENSEMBLE_STATS) {
			const a = ensembleMap(rs, stat, 1);
			expect(a[3], stat).toBeNaN();
			expectSameBits(ensembleMap(rs, stat, 1), a, stat);
		}
	});

	it('ensembleMap refuses no realizations, unequal lengths, an unknown stat and below without a threshold', () => {
		expect(() => ensembleMap([], 'mean')).toThrow(RangeError);
		expect(() => ensembleMap([new Float64Array(2), new Float64Array(3)], 'mean')).toThrow('realizations differ in length');
		expect(() => ensembleMap([new Float64Array(2)], 'mode' as never)).toThrow('unknown stat mode');
		expect(() => ensembleMap([new Float64Array(2)], 'below')).toThrow('below needs a finite threshold');
		expect(() => ensembleMap([new Float64Array(2)], 'below', NaN)).toThrow(RangeError);
	});

	it('ensembleMap does not mutate the realizations (quantiles sort a copy)', () => {
		const rs = realizations(5, 4);
		const copy = rs.map((r) => Float64Array.from(r));
		ensembleMap(rs, 'p50');
		rs.forEach((r, k) => expectSameBits(r, copy[k]));
	});
});
