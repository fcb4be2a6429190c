import { describe, expect, it } from 'vitest';
import { mean, median, standardDeviation } from 'simple-statistics';
import { domainStatistics } from '../../src/lib/site/index';
import { expectAbsClose } from '../asserts';

describe('domainStatistics(values, weights)', () => {
	it('domainStatistics(values, equal weights) matches simple-statistics mean, population sd and median', () => {
		const values = [12, 7, 3.5, 19, 8, 8, 1, 15.25, 4, 10];
		const w = new Array(values.length).fill(1 / values.length);
		const s = domainStatistics(values, w);
		expect(s.n).toBe(10);
		expectAbsClose(s.mean, mean(values), 1e-12, 'mean');
		expectAbsClose(s.sd, standardDeviation(values), 1e-12, 'sd (population)');
		expectAbsClose(s.p50, median(values), 1e-12, 'P50');
	});

	it('domainStatistics(values, w) puts P10 and P90 at the Hyndman & Fan (1996) definition-5 positions', () => {
		// 1…10 at (i − ½)/10: P10 lies between 1 (0.05) and 2 (0.15) → 1.5; P90 between 9 and 10 → 9.5.
		const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
		const s = domainStatistics(values, new Array(10).fill(0.1));
		expectAbsClose(s.p10, 1.5, 1e-12, 'P10');
		expectAbsClose(s.p90, 9.5, 1e-12, 'P90');
	});

	it('domainStatistics(values, w) of one sample has sd 0; of none, NaN', () => {
		expect(domainStatistics([4], [1])).toEqual({ n: 1, mean: 4, sd: 0, p10: 4, p50: 4, p90: 4 });
		const empty = domainStatistics([], []);
		expect(empty.n).toBe(0);
		expect(empty.mean).toBeNaN();
	});
});
