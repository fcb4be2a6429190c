// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { finesContentFromIc } from '$lib/cpt';
import { expectAbsClose } from '../asserts';

describe('finesContentFromIc(Ic, CFC)', () => {
	it('finesContentFromIc(Ic, CFC) is 80(Ic + CFC) − 137 inside 0–100 (Boulanger & Idriss 2014)', () => {
		expectAbsClose(finesContentFromIc(2.2), 80 * 2.2 - 137, 1e-12);
		expectAbsClose(finesContentFromIc(2.2, 0.1), 80 * 2.3 - 137, 1e-12);
		// Hand-worked: FC = 0 at Ic = 137/80 = 1.7125, FC = 100 at Ic = 237/80 = 2.9625.
		expectAbsClose(finesContentFromIc(1.7125), 0, 1e-12);
		expectAbsClose(finesContentFromIc(2.9625), 100, 1e-12);
	});
	it('finesContentFromIc(Ic, CFC) is clamped to 0–100 as the method defines', () => {
		expect(finesContentFromIc(1.2)).toBe(0);
		expect(finesContentFromIc(3.8)).toBe(100);
		expect(finesContentFromIc(2.5, -1)).toBe(0);
	});
	it('finesContentFromIc(NaN) is NaN', () => {
		expect(finesContentFromIc(NaN)).toBeNaN();
	});
});
