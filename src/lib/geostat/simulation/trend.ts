import type { Sample } from '../types';

/**
 * A linear trend of the mean, m(x, y, z) = constant + gx·(x − x0) + gy·(y − y0) + gz·(z − z0), in the
 * property's units per unit length. The origin is where the constant applies (the fit centres the
 * coordinates there, which keeps the arithmetic well conditioned). A domain with a trend is simulated on
 * its residuals v − m and gets m added back at each target (Goovaerts 1997, ch. 6 and 8, from memory).
 */
export interface LinearTrend {
	origin: { x: number; y: number; z: number };
	constant: number;
	gradient: { x: number; y: number; z: number };
}

/**
 * The trend's mean at (x, y, z). One fixed sequence of +, −, × (evaluated left to right), so the value is
 * the same bits in every JavaScript engine. Inner-loop helper: no validation.
 */
export function trendValue(t: LinearTrend, x: number, y: number, z: number): number {
	return t.constant + t.gradient.x * (x - t.origin.x) + t.gradient.y * (y - t.origin.y) + t.gradient.z * (z - t.origin.z);
}

/**
 * Residuals vᵢ − m(xᵢ, yᵢ, zᵢ) of samples from a trend, in sample order. Not mutating.
 */
export function trendResiduals(samples: ReadonlyArray<Sample>, t: LinearTrend): number[] {
	return samples.map((s) => s.value - trendValue(t, s.x, s.y, s.z));
}

/**
 * Checks a trend's shape once, at a public boundary.
 * @throws {TypeError} on a malformed trend
 * @throws {RangeError} on a non-finite number
 */
export function validateTrend(t: LinearTrend): void {
	if (t === null || typeof t !== 'object' || typeof t.origin !== 'object' || typeof t.gradient !== 'object' || t.origin === null || t.gradient === null) {
		throw new TypeError('trend must have origin, constant and gradient');
	}
	const numbers = [t.constant, t.origin.x, t.origin.y, t.origin.z, t.gradient.x, t.gradient.y, t.gradient.z];
	if (!numbers.every((v) => typeof v === 'number')) throw new TypeError('trend must have origin, constant and gradient');
	if (!numbers.every(Number.isFinite)) throw new RangeError('trend numbers must be finite');
}
