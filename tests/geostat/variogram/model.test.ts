import { describe, it, expect } from 'vitest';
import {
	gamma,
	covariance,
	compileVariogram,
	planRotation,
	reducedDistance,
	unitGamma,
	totalSill,
	validateVariogramModel,
	type VariogramModel,
	type Structure
} from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

function one(type: Structure['type'], a: number, sill = 1): VariogramModel {
	return { structures: [{ type, sill, rangeMajor: a, rangeMinor: a, rangeVertical: a }], azimuth: 0 };
}

describe('gamma(model, dx, dy, dz)', () => {
	it('gamma(model, h) reaches the practical-range values at h = a (REFERENCES.md practical-range forms)', () => {
		// Spherical: exactly the sill at the range; exponential: 1 − e^−3 = 0.950212931632136; Gaussian the same.
		expect(gamma(one('spherical', 10, 2), 10, 0, 0)).toBe(2);
		expectAbsClose(gamma(one('exponential', 10, 2), 10, 0, 0), 2 * 0.950212931632136, 1e-15);
		expectAbsClose(gamma(one('gaussian', 10, 2), 0, 10, 0), 2 * 0.950212931632136, 1e-15);
		// Spherical at half the range: 1.5·0.5 − 0.5·0.125 = 0.6875 (exact in binary).
		expect(gamma(one('spherical', 10), 5, 0, 0)).toBe(0.6875);
		// Spherical stays at its sill beyond the range.
		expect(gamma(one('spherical', 10), 25, 0, 0)).toBe(1);
	});

	it('gamma(model, h) follows the closed forms at intermediate h to 1e-15 absolute', () => {
		for (const h of [0.3, 1, 2.7, 7.5, 31]) {
			const r = h / 8;
			expectAbsClose(gamma(one('exponential', 8), h, 0, 0), 1 - Math.exp(-3 * r), 1e-15, `exp h=${h}`);
			expectAbsClose(gamma(one('gaussian', 8), h, 0, 0), 1 - Math.exp(-3 * r * r), 1e-15, `gau h=${h}`);
			expectAbsClose(gamma(one('spherical', 8), h, 0, 0), r < 1 ? 1.5 * r - 0.5 * r ** 3 : 1, 1e-15, `sph h=${h}`);
		}
	});

	it('gamma(model, 0) is exactly 0 and a nugget jumps to its sill just above 0', () => {
		const m: VariogramModel = {
			structures: [
				{ type: 'nugget', sill: 0.25, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
				{ type: 'exponential', sill: 0.75, rangeMajor: 10, rangeMinor: 10, rangeVertical: 2 }
			],
			azimuth: 0
		};
		expect(gamma(m, 0, 0, 0)).toBe(0);
		expectAbsClose(gamma(m, 1e-12, 0, 0), 0.25, 1e-11);
		expectAbsClose(gamma(m, 0, 0, 1e-300), 0.25, 1e-15);
		expect(gamma(m, 0, 0, 1e6)).toBe(1);
	});

	it('gamma(model) is symmetric, gamma(h) = gamma(−h)', () => {
		const m: VariogramModel = {
			structures: [{ type: 'spherical', sill: 1, rangeMajor: 30, rangeMinor: 10, rangeVertical: 2 }],
			azimuth: 37
		};
		for (const [dx, dy, dz] of [[3, 4, 0.5], [-7, 2, 1], [0, 9, -1.2]]) {
			expect(gamma(m, -dx, -dy, -dz)).toBe(gamma(m, dx, dy, dz));
		}
	});

	it('gamma(model) with azimuth 90 along +x equals azimuth 0 along +y (anisotropy equivalence)', () => {
		const s = { type: 'exponential' as const, sill: 1, rangeMajor: 40, rangeMinor: 8, rangeVertical: 1 };
		const east = { structures: [s], azimuth: 90 };
		const north = { structures: [s], azimuth: 0 };
		// Major axis along x: separation 20 along x is half the major range; along y it is 2.5 minor ranges.
		expectAbsClose(gamma(east, 20, 0, 0), 1 - Math.exp(-1.5), 1e-15);
		expectAbsClose(gamma(north, 0, 20, 0), 1 - Math.exp(-1.5), 1e-15);
		expectAbsClose(gamma(east, 0, 20, 0), 1 - Math.exp(-7.5), 1e-15);
		// Rotating the separation with the axes leaves gamma unchanged (azimuth 30°: major axis (sin 30, cos 30)).
		const rot = { structures: [s], azimuth: 30 };
		const t = 30 * (Math.PI / 180);
		expectAbsClose(gamma(rot, 20 * Math.sin(t), 20 * Math.cos(t), 0), gamma(north, 0, 20, 0), 1e-15);
		expectAbsClose(gamma(rot, 5 * Math.cos(t), -5 * Math.sin(t), 0.3), gamma(north, 5, 0, 0.3), 1e-15);
	});

	it('gamma(model) in 3D uses the reduced distance sqrt((u/a1)² + (v/a2)² + (dz/a3)²)', () => {
		const m: VariogramModel = {
			structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 10, rangeVertical: 1 }],
			azimuth: 0
		};
		// dx is along the minor axis (azimuth 0 → major is +y): r = sqrt((6/20)² + (3/10)² + (0.4/1)²) = sqrt(0.34).
		expectAbsClose(gamma(m, 3, 6, 0.4), 1 - Math.exp(-3 * Math.sqrt(0.34)), 1e-15);
		// An isotropic-equivalent: scaling each axis by its range gives the same value as one isotropic unit model.
		expectAbsClose(gamma(m, 3, 6, 0.4), gamma(one('exponential', 1), 0.3, 0.3, 0.4), 1e-15);
	});

	it('gamma(model) on a 2D section (y = 0) with rangeMajor = rangeMinor ignores the azimuth', () => {
		const s = { type: 'gaussian' as const, sill: 1, rangeMajor: 15, rangeMinor: 15, rangeVertical: 1.5 };
		for (const az of [0, 33, 90, 200]) {
			expectAbsClose(gamma({ structures: [s], azimuth: az }, 6, 0, 0.5), gamma({ structures: [s], azimuth: 0 }, 6, 0, 0.5), 1e-15, `az=${az}`);
		}
	});

	it('gamma(model) sums nested structures', () => {
		const a: Structure = { type: 'spherical', sill: 0.4, rangeMajor: 5, rangeMinor: 5, rangeVertical: 5 };
		const b: Structure = { type: 'exponential', sill: 0.6, rangeMajor: 50, rangeMinor: 50, rangeVertical: 50 };
		const m = { structures: [a, b], azimuth: 0 };
		expectAbsClose(gamma(m, 3, 0, 0), gamma({ structures: [a], azimuth: 0 }, 3, 0, 0) + gamma({ structures: [b], azimuth: 0 }, 3, 0, 0), 1e-16);
	});
});

describe('covariance(model, dx, dy, dz)', () => {
	it('covariance(model, h) = total sill − gamma(model, h), total sill at 0', () => {
		const m: VariogramModel = {
			structures: [
				{ type: 'nugget', sill: 0.2, rangeMajor: 1, rangeMinor: 1, rangeVertical: 1 },
				{ type: 'spherical', sill: 1.3, rangeMajor: 12, rangeMinor: 6, rangeVertical: 2 }
			],
			azimuth: 45
		};
		expect(totalSill(m)).toBe(1.5);
		expect(covariance(m, 0, 0, 0)).toBe(1.5);
		for (const [dx, dy, dz] of [[1, 2, 0.1], [10, -3, 0], [0, 0, 5]]) {
			expect(covariance(m, dx, dy, dz)).toBe(1.5 - gamma(m, dx, dy, dz));
		}
		expect(covariance(m, 100, 100, 100)).toBe(0);
	});

	it('compileVariogram(model) gives the same bits as gamma and covariance', () => {
		const m = one('exponential', 7, 3);
		const c = compileVariogram(m);
		expect(c.sill).toBe(3);
		expect(c.gamma(1, 2, 3)).toBe(gamma(m, 1, 2, 3));
		expect(c.covariance(1, 2, 3)).toBe(covariance(m, 1, 2, 3));
	});
});

describe('reducedDistance, planRotation, unitGamma', () => {
	it('reducedDistance(s, planRotation(az), ...) is 1 at the major range along the azimuth', () => {
		const s = { rangeMajor: 10, rangeMinor: 2, rangeVertical: 1 };
		expectAbsClose(reducedDistance(s, planRotation(90), 10, 0, 0), 1, 1e-15);
		expectAbsClose(reducedDistance(s, planRotation(0), 0, 10, 0), 1, 1e-15);
		expectAbsClose(reducedDistance(s, planRotation(0), 2, 0, 0), 1, 1e-15);
		expectAbsClose(reducedDistance(s, planRotation(0), 0, 0, -1), 1, 1e-15);
	});

	it('unitGamma(type, 0) is 0 for every type', () => {
		for (const t of ['nugget', 'spherical', 'exponential', 'gaussian'] as const) expect(unitGamma(t, 0)).toBe(0);
	});
});

describe('validateVariogramModel(model)', () => {
	it('validateVariogramModel rejects bad types, sills and ranges', () => {
		expect(() => gamma({ structures: [{ type: 'cubic', sill: 1, rangeMajor: 1, rangeMinor: 1, rangeVertical: 1 }], azimuth: 0 } as unknown as VariogramModel, 1, 0, 0)).toThrow('unknown structure type');
		expect(() => gamma(one('spherical', 0), 1, 0, 0)).toThrow(RangeError);
		expect(() => gamma(one('spherical', NaN), 1, 0, 0)).toThrow('ranges must be > 0');
		expect(() => gamma(one('spherical', 1, -1), 1, 0, 0)).toThrow('sill must be finite and >= 0');
		expect(() => gamma({ structures: [], azimuth: NaN }, 1, 0, 0)).toThrow(TypeError);
		expect(() => validateVariogramModel(null as unknown as VariogramModel)).toThrow(TypeError);
	});

	it('gamma(model) of an empty model is 0, Infinity minor range is allowed, and huge separations give the sill', () => {
		expect(gamma({ structures: [], azimuth: 0 }, 5, 5, 5)).toBe(0);
		const m = { structures: [{ type: 'exponential' as const, sill: 1, rangeMajor: 10, rangeMinor: Infinity, rangeVertical: 1 }], azimuth: 0 };
		expect(gamma(m, 1e9, 0, 0)).toBe(0);
		expect(gamma(one('gaussian', 1), 1e300, 0, 0)).toBe(1);
	});

	it('gamma(model) does not mutate the model', () => {
		const m = one('spherical', 4);
		const copy = JSON.stringify(m);
		gamma(m, 1, 1, 1);
		compileVariogram(m);
		expect(JSON.stringify(m)).toBe(copy);
	});
});
