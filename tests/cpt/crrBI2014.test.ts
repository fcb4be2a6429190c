// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { crrBI2014 } from '$lib/cpt';
import { expectAbsClose, expectRelClose } from '../asserts';

describe('crrBI2014(qc1Ncs)', () => {
	const formula = (q: number) => Math.exp(q / 113 + (q / 1000) ** 2 - (q / 140) ** 3 + (q / 137) ** 4 - 2.8);
	it('crrBI2014(qc1Ncs) matches the published curve (Boulanger & Idriss 2014)', () => {
		for (const q of [21, 50, 80, 100, 120, 150, 180, 211]) expectRelClose(crrBI2014(q), formula(q), 1e-13, `q = ${q}`);
		// Hand-worked: at 100 the exponent is 0.884956 + 0.01 − 0.364431 + 0.283869 − 2.8 = −1.985606.
		expectAbsClose(crrBI2014(100), Math.exp(-1.985606), 1e-6);
	});
	it('crrBI2014(qc1Ncs) increases with qc1Ncs', () => {
		let prev = -Infinity;
		for (let q = 0; q <= 254; q += 0.5) {
			const c = crrBI2014(q);
			expect(c).toBeGreaterThan(prev);
			prev = c;
		}
	});
	it('crrBI2014(NaN) is NaN', () => {
		expect(crrBI2014(NaN)).toBeNaN();
	});
});
