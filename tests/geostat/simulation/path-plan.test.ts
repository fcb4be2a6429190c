import { describe, it, expect } from 'vitest';
import { PathPlan } from '../../../src/lib/geostat/simulation/path-plan';

describe('PathPlan', () => {
	it('PathPlan records steps in path order, packed, and takes each weight from the given offset', () => {
		const plan = new PathPlan(3, 4);
		expect(plan.wants(0)).toBe(true);
		expect(plan.wants(1)).toBe(false);
		plan.push(2, Int32Array.from([-1, 7]), Float64Array.from([9, 9, 0.25, 0.5]), 2, 0.8);
		plan.push(0, new Int32Array(4), new Float64Array(4), 0, 1);
		plan.push(3, Int32Array.from([3, -4, 5]), Float64Array.from([0.1, 0.2, 0.3]), 0, 0.4);
		expect(plan.recorded).toBe(3);
		expect(Array.from(plan.start)).toEqual([0, 2, 2, 5]);
		expect(Array.from(plan.ref.subarray(0, 5))).toEqual([-1, 7, 3, -4, 5]);
		expect(Array.from(plan.w.subarray(0, 5))).toEqual([0.25, 0.5, 0.1, 0.2, 0.3]);
		expect(Array.from(plan.sd)).toEqual([0.8, 1, 0.4]);
		// Full: it wants no more steps and refuses one.
		expect(plan.wants(3)).toBe(false);
		expect(() => plan.push(1, new Int32Array(1), new Float64Array(1), 0, 1)).toThrow(RangeError);
	});

	it('PathPlan refuses more entries than kmax and bad sizes, and states its bytes', () => {
		const plan = new PathPlan(2, 2);
		expect(() => plan.push(3, new Int32Array(3), new Float64Array(3), 0, 1)).toThrow(/kmax/);
		expect(plan.recorded).toBe(0);
		expect(() => new PathPlan(-1, 2)).toThrow(RangeError);
		expect(() => new PathPlan(2, 1.5)).toThrow(RangeError);
		// sd 8 + start 4 per step (and one more start), weight 8 + reference 4 per entry.
		expect(PathPlan.bytes(10, 32)).toBe(10 * (12 + 12 * 32) + 4);
		const p = new PathPlan(10, 32);
		expect(p.sd.byteLength + p.start.byteLength + p.ref.byteLength + p.w.byteLength).toBe(PathPlan.bytes(10, 32));
	});
});
