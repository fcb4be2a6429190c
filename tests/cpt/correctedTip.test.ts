// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { correctedTip } from '$lib/cpt';
import { expectAbsClose } from '../asserts';

describe('correctedTip(qc, u2, a)', () => {
	it('correctedTip(qc, u2, a) adds u2·(1 − a) (Lunne et al. 1997)', () => {
		// Hand-worked: 2000 + 300·(1 − 0.8) = 2060 kPa.
		expectAbsClose(correctedTip(2000, 300, 0.8), 2060, 1e-9);
		expect(correctedTip(2000, 300, 1)).toBe(2000);
		expect(correctedTip(2000, 0, 0.7)).toBe(2000);
		expect(correctedTip(2000, -50, 0)).toBe(1950);
	});
	it('correctedTip(qc, NaN, a) is NaN', () => {
		expect(correctedTip(2000, NaN, 0.8)).toBeNaN();
		expect(correctedTip(NaN, 10, 0.8)).toBeNaN();
	});
	it('correctedTip(qc, u2, a) throws RangeError for a outside 0–1', () => {
		expect(() => correctedTip(1, 1, 1.2)).toThrow(RangeError);
		expect(() => correctedTip(1, 1, -0.1)).toThrow('area ratio must be within 0–1');
		expect(() => correctedTip(1, 1, NaN)).toThrow(RangeError);
	});
});
