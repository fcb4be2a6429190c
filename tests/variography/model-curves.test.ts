import { describe, expect, it } from 'vitest';
import { unitGamma, type VariogramModel } from '../../src/lib/geostat/index';
import { modelCurves } from '../../src/lib/variography/index';
import { expectAbsClose } from '../asserts';

// Nugget 0.2 plus an exponential of sill 0.8: major range 40 along azimuth 30°, minor 10, vertical 1.
const model: VariogramModel = {
	azimuth: 30,
	structures: [
		{ type: 'nugget', sill: 0.2, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
		{ type: 'exponential', sill: 0.8, rangeMajor: 40, rangeMinor: 10, rangeVertical: 1 }
	]
};
const expected = (r: number) => 0.2 + 0.8 * unitGamma('exponential', r);

describe('modelCurves(model, azimuth)', () => {
	it('modelCurves(m).vertical(h) is γ at h / rangeVertical', () => {
		const c = modelCurves(model);
		for (const h of [0.1, 0.5, 1, 3]) expectAbsClose(c.vertical(h), expected(h / 1), 1e-12, `h = ${h}`);
	});

	it('modelCurves(m).horizontal(h) runs along the major axis by default, and along the minor axis at azimuth + 90°', () => {
		const major = modelCurves(model);
		const minor = modelCurves(model, model.azimuth + 90);
		for (const h of [2, 10, 40, 100]) {
			expectAbsClose(major.horizontal(h), expected(h / 40), 1e-12, `major h = ${h}`);
			expectAbsClose(minor.horizontal(h), expected(h / 10), 1e-12, `minor h = ${h}`);
		}
		// .minor runs across the azimuth: the same as .horizontal at azimuth + 90°.
		for (const h of [2, 10, 40]) expectAbsClose(major.minor(h), expected(h / 10), 1e-12, `minor of major h = ${h}`);
		// The exponential reaches 95 % of its sill at its practical range (common practice).
		expectAbsClose((major.horizontal(40) - 0.2) / 0.8, 1 - Math.exp(-3), 1e-12, 'practical range');
	});

	it('modelCurves(m) is 0 at h = 0 (the nugget jumps only beyond), and the total sill far out', () => {
		const c = modelCurves(model);
		expect(c.vertical(0)).toBe(0);
		expect(c.horizontal(0)).toBe(0);
		expectAbsClose(c.horizontal(1e6), 1, 1e-12, 'sill');
	});

	it('modelCurves(m) rejects an invalid model and a non-finite azimuth', () => {
		expect(() => modelCurves({ azimuth: 0, structures: [{ type: 'spherical', sill: 1, rangeMajor: 0, rangeMinor: 1, rangeVertical: 1 }] })).toThrow();
		expect(() => modelCurves(model, NaN)).toThrow(TypeError);
	});
});
