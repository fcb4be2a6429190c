import { describe, expect, it } from 'vitest';
import { robustRange } from '../../src/lib/plots/robust-range';
import { expectAbsClose, expectRelClose } from '../asserts';

/** 0.20, 0.21 … 0.39: an ordinary clay's su/σ′v. */
const clay = Array.from({ length: 200 }, (_, i) => 0.2 + (i % 20) * 0.01);

describe('robustRange(values, options)', () => {
	it('robustRange keeps the values own range when nothing stands out', () => {
		const r = robustRange(clay);
		expectAbsClose(r.domain[0], 0.2, 1e-12, 'lo');
		expectAbsClose(r.domain[1], 0.39, 1e-12, 'hi');
		expect([r.below, r.above]).toEqual([0, 0]);
	});

	it('robustRange clips a near-surface spike and counts what lies beyond', () => {
		// Five readings of 30–200 where σ′v tends to zero, over 200 ordinary ones.
		const r = robustRange([30, 80, 120, 200, 150, ...clay]);
		expect(r.above).toBeGreaterThan(0); // the 1st–99th percentile span reaches into the spike: only its top is clipped
		expect(r.domain[1]).toBeLessThan(200);
		// The plausible range of su/σ′v (0–1.5, common practice) bounds it further: every spike value lies beyond.
		const p = robustRange([30, 80, 120, 200, 150, ...clay], { plausible: { min: 0, max: 1.5 } });
		expect(p.domain[1]).toBeLessThanOrEqual(1.5);
		expect(p.above).toBe(5);
		expect(p.below).toBe(0);
	});

	it('robustRange starts a linear axis at zero when asked, and works on log10 of positive values for a log axis', () => {
		expect(robustRange([5, 10, 20], { fromZero: true }).domain).toEqual([0, 20]);
		const r = robustRange([0, -1, 0.1, 1, 10, 100, null, NaN], { scale: 'log' });
		expectRelClose(r.domain[0], 0.1, 1e-12, 'lo');
		expectRelClose(r.domain[1], 100, 1e-12, 'hi');
	});

	it('robustRange gives a unit range for no usable values and widens a single value', () => {
		expect(robustRange([])).toEqual({ domain: [0, 1], below: 0, above: 0 });
		expect(robustRange([null, NaN, Infinity])).toEqual({ domain: [0, 1], below: 0, above: 0 });
		expect(robustRange([-3], { scale: 'log' })).toEqual({ domain: [1, 10], below: 0, above: 0 });
		expect(robustRange([2]).domain).toEqual([1.5, 2.5]);
	});

	it('robustRange does not mutate its input', () => {
		const v = [3, 1, 2];
		robustRange(v);
		expect(v).toEqual([3, 1, 2]);
	});
});
