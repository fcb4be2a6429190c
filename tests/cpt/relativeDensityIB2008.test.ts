// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { relativeDensityIB2008 } from '$lib/cpt';
import { expectAbsClose } from '../asserts';

describe('relativeDensityIB2008(qc1Ncs, Cdq)', () => {
	it('relativeDensityIB2008(qc1Ncs) is 0.465(qc1Ncs/0.9)^0.264 − 1.063 (Idriss & Boulanger 2008)', () => {
		for (const q of [30, 60, 100, 150, 200]) {
			expectAbsClose(relativeDensityIB2008(q), 0.465 * Math.pow(q / 0.9, 0.264) - 1.063, 1e-13);
		}
		expectAbsClose(relativeDensityIB2008(100, 0.64), 0.465 * Math.pow(100 / 0.64, 0.264) - 1.063, 1e-13);
	});
	it('relativeDensityIB2008(qc1Ncs) spans about 0–1 over 21–254, the limits inside m', () => {
		// Follows from the equation: Dr = 0 at 0.9·(1.063/0.465)^(1/0.264) ≈ 20.6, Dr = 1 at ≈ 254.5.
		expectAbsClose(relativeDensityIB2008(21), 0, 0.01);
		expectAbsClose(relativeDensityIB2008(254), 1, 0.01);
	});
	it('relativeDensityIB2008(qc1Ncs) is not clamped', () => {
		expect(relativeDensityIB2008(400)).toBeGreaterThan(1);
		expect(relativeDensityIB2008(5)).toBeLessThan(0);
	});
	it('relativeDensityIB2008(qc1Ncs) is NaN for negative or NaN input and throws for Cdq ≤ 0', () => {
		expect(relativeDensityIB2008(-3)).toBeNaN();
		expect(relativeDensityIB2008(NaN)).toBeNaN();
		expect(() => relativeDensityIB2008(100, 0)).toThrow('Cdq must be positive');
	});
});
