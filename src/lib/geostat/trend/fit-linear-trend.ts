import { choleskyFactor, choleskySolve } from '../linalg/cholesky';
import type { LinearTrend } from '../simulation/trend';
import { trendValue } from '../simulation/trend';
import type { Sample } from '../types';

/** Which coordinates a linear trend may follow: elevation only, or elevation and the plan coordinates. */
export type TrendTerms = 'elevation' | 'elevation-plan';

/** A fitted linear trend with what the fit tells about it. */
export interface LinearTrendFit {
	trend: LinearTrend;
	/** The coordinates actually used: a requested one along which the samples do not spread is left out. */
	used: { x: boolean; y: boolean; z: boolean };
	/** Weighted variance of the values and of the residuals (population, divisor Σw). */
	variance: number;
	residualVariance: number;
	/** Share of the weighted variance the trend explains, 1 − residualVariance / variance (0 when variance is 0). */
	r2: number;
}

/**
 * A linear trend of the mean fitted by weighted least squares (Draper & Smith 1998, *Applied Regression
 * Analysis*, ch. 9, from memory): minimises Σ wᵢ (vᵢ − m(xᵢ))² with the declustering weights wᵢ, so
 * clustered soundings do not pull the trend (Deutsch 1989 for the weights). Coordinates are centred on their
 * weighted means (the trend's origin), which makes the constant the weighted mean of the values and leaves a
 * small normal-equation system for the gradient, solved by the engine's Cholesky factorisation: arithmetic
 * and square roots only, so the coefficients are the same bits in every JavaScript engine and can go into a
 * recipe. Elevation (z) is always a term; with 'elevation-plan' x and y are too. A coordinate whose weighted
 * spread is zero (y along a 2D section, or z of a single level) is left out (gradient 0, `used` false).
 * Weights default to equal. Inputs are not mutated.
 * @throws {TypeError} if samples is not an array or terms is unknown
 * @throws {RangeError} if there are no samples, weights do not match, a weight is negative or all are 0,
 *   or a value or coordinate is not finite
 * @throws {Error} 'trend is not determined by the samples' if the used coordinates are collinear
 */
export function fitLinearTrend(samples: ReadonlyArray<Sample>, weights: ArrayLike<number> | undefined, terms: TrendTerms): LinearTrendFit {
	if (!Array.isArray(samples)) throw new TypeError('samples must be an array');
	if (terms !== 'elevation' && terms !== 'elevation-plan') throw new TypeError("terms must be 'elevation' or 'elevation-plan'");
	const n = samples.length;
	if (n === 0) throw new RangeError('no samples');
	if (weights !== undefined && weights.length !== n) throw new RangeError('weights must match samples');
	const w = new Float64Array(n);
	let sw = 0;
	for (let i = 0; i < n; i++) {
		const s = samples[i];
		if (![s.x, s.y, s.z, s.value].every(Number.isFinite)) throw new RangeError('sample coordinates and values must be finite');
		const wi = weights === undefined ? 1 : weights[i];
		if (!(wi >= 0) || !Number.isFinite(wi)) throw new RangeError('weights must be finite and >= 0');
		w[i] = wi;
		sw += wi;
	}
	if (!(sw > 0)) throw new RangeError('weights must not all be 0');

	const mean = (get: (s: Sample) => number) => {
		let m = 0;
		for (let i = 0; i < n; i++) m += w[i] * get(samples[i]);
		return m / sw;
	};
	const origin = { x: mean((s) => s.x), y: mean((s) => s.y), z: mean((s) => s.z) };
	const constant = mean((s) => s.value);
	const axes: ('x' | 'y' | 'z')[] = terms === 'elevation' ? ['z'] : ['x', 'y', 'z'];
	// A coordinate counts when its weighted spread is more than rounding noise of its magnitude.
	const used = { x: false, y: false, z: false };
	const cols: ('x' | 'y' | 'z')[] = [];
	for (const a of axes) {
		let v = 0;
		let big = 0;
		for (let i = 0; i < n; i++) {
			const d = samples[i][a] - origin[a];
			v += w[i] * d * d;
			big = Math.max(big, Math.abs(samples[i][a]));
		}
		if (v / sw > 1e-20 * (big * big + 1)) {
			used[a] = true;
			cols.push(a);
		}
	}

	const gradient = { x: 0, y: 0, z: 0 };
	const k = cols.length;
	if (k > 0) {
		const a = new Float64Array(k * k);
		const b = new Float64Array(k);
		for (let i = 0; i < n; i++) {
			const s = samples[i];
			const dv = s.value - constant;
			for (let p = 0; p < k; p++) {
				const dp = s[cols[p]] - origin[cols[p]];
				b[p] += w[i] * dp * dv;
				for (let q = 0; q <= p; q++) a[p * k + q] += w[i] * dp * (s[cols[q]] - origin[cols[q]]);
			}
		}
		// Scaled to unit diagonal (a correlation matrix), so a pivot test compares like with like whatever the
		// coordinates' magnitudes; collinear coordinates (soundings on one line in plan) then fail it.
		const scale = new Float64Array(k);
		for (let p = 0; p < k; p++) scale[p] = Math.sqrt(a[p * k + p]);
		for (let p = 0; p < k; p++) {
			b[p] /= scale[p];
			for (let q = 0; q <= p; q++) a[p * k + q] /= scale[p] * scale[q];
		}
		if (!choleskyFactor(a, k, 1e-10)) throw new Error('trend is not determined by the samples');
		const g = new Float64Array(k);
		choleskySolve(a, k, b, g);
		cols.forEach((c, p) => (gradient[c] = g[p] / scale[p]));
	}
	const trend: LinearTrend = { origin, constant, gradient };
	let variance = 0;
	let residualVariance = 0;
	for (let i = 0; i < n; i++) {
		const s = samples[i];
		const d = s.value - constant;
		const r = s.value - trendValue(trend, s.x, s.y, s.z);
		variance += w[i] * d * d;
		residualVariance += w[i] * r * r;
	}
	variance /= sw;
	residualVariance /= sw;
	return { trend, used, variance, residualVariance, r2: variance > 0 ? 1 - residualVariance / variance : 0 };
}
