// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { undrainedStrength } from '$lib/cpt';

describe('undrainedStrength(qt, sigmaV, Nkt)', () => {
	it('undrainedStrength(qt, sigmaV, Nkt) is (qt − σv)/Nkt (Lunne et al. 1997)', () => {
		// Hand-worked: (800 − 100)/14 = 50 kPa.
		expect(undrainedStrength(800, 100, 14)).toBe(50);
		expect(undrainedStrength(80, 100, 10)).toBe(-2);
	});
	it('undrainedStrength(qt, sigmaV, Nkt) throws RangeError for Nkt ≤ 0', () => {
		expect(() => undrainedStrength(800, 100, 0)).toThrow('Nkt must be positive');
		expect(() => undrainedStrength(800, 100, NaN)).toThrow(RangeError);
	});
});
