import { compileVariogram } from '../variogram/model';
import type { Sample, VariogramModel } from '../types';
import { choleskyFactor, choleskySolve } from '../linalg/cholesky';

/** Result of krige. */
export interface KrigingResult {
	estimate: number;
	/** Kriging (estimation) variance, ≥ 0. */
	variance: number;
	/** One weight per datum, in input order. */
	weights: Float64Array;
}

/** Options of krige. */
export interface KrigingOptions {
	type: 'simple' | 'ordinary';
	/** Known mean of simple kriging; default 0. Ignored by ordinary kriging. */
	mean?: number;
}

/**
 * Simple or ordinary kriging of one target from data, with the covariance C(h) = sill − γ(h) of a
 * variogram model (Goovaerts 1997, ch. 5; Isaaks & Srivastava 1989, ch. 12; Journel & Huijbregts 1978).
 *
 * Simple: C·λ = c, estimate m + Σλᵢ(zᵢ − m), variance C(0) − λᵀc.
 * Ordinary: C·λ + μ·1 = c with Σλᵢ = 1, variance C(0) − λᵀc − μ. It is solved through the positive-definite
 * matrix C alone: with w = C⁻¹c and u = C⁻¹1, μ = (1ᵀw − 1)/(1ᵀu) and λ = w − μ·u (block elimination of the
 * Lagrange row), which keeps one Cholesky factor for both solves.
 *
 * Exact at a datum: a target at a datum's location gets its value, variance 0 and a unit weight.
 * With no data, simple kriging returns the mean and the sill.
 * @throws {TypeError} on malformed data, target or options
 * @throws {RangeError} on non-finite values or coordinates, or ordinary kriging without data
 * @throws {Error} 'duplicate sample locations: i and j' when two data share a location,
 *   'singular kriging system' when the covariance matrix is not positive definite
 */
export function krige(
	data: Sample[],
	target: { x: number; y: number; z: number },
	model: VariogramModel,
	opts: KrigingOptions
): KrigingResult {
	if (!Array.isArray(data)) throw new TypeError('data must be an array of samples');
	if (target === null || typeof target !== 'object') throw new TypeError('target must be a point');
	if (opts === null || typeof opts !== 'object') throw new TypeError('options must be an object');
	const { type, mean = 0 } = opts;
	if (type !== 'simple' && type !== 'ordinary') throw new TypeError("type must be 'simple' or 'ordinary'");
	if (!Number.isFinite(mean)) throw new RangeError('mean must be finite');
	for (const c of [target.x, target.y, target.z]) {
		if (typeof c !== 'number' || !Number.isFinite(c)) throw new RangeError('target coordinates must be finite');
	}
	const n = data.length;
	for (let i = 0; i < n; i++) {
		const s = data[i];
		if (s === null || typeof s !== 'object') throw new TypeError('data must be an array of samples');
		if (![s.x, s.y, s.z, s.value].every((v) => typeof v === 'number' && Number.isFinite(v))) {
			throw new RangeError('sample coordinates and values must be finite');
		}
	}
	const cov = compileVariogram(model);
	const c0 = cov.sill;
	if (n === 0) {
		if (type === 'ordinary') throw new RangeError('ordinary kriging needs at least one datum');
		return { estimate: mean, variance: c0, weights: new Float64Array(0) };
	}
	for (let i = 0; i < n; i++) {
		const s = data[i];
		if (s.x === target.x && s.y === target.y && s.z === target.z) {
			const weights = new Float64Array(n);
			weights[i] = 1;
			checkDuplicates(data);
			return { estimate: s.value, variance: 0, weights };
		}
	}
	checkDuplicates(data);

	const a = new Float64Array(n * n);
	const rhs = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const si = data[i];
		rhs[i] = cov.covariance(si.x - target.x, si.y - target.y, si.z - target.z);
		for (let j = 0; j <= i; j++) {
			const sj = data[j];
			a[i * n + j] = i === j ? c0 : cov.covariance(si.x - sj.x, si.y - sj.y, si.z - sj.z);
		}
	}
	if (!choleskyFactor(a, n)) throw new Error('singular kriging system');
	const w = choleskySolve(a, n, rhs);
	let estimate: number;
	let variance: number;
	if (type === 'simple') {
		estimate = mean;
		variance = c0;
		for (let i = 0; i < n; i++) {
			estimate += w[i] * (data[i].value - mean);
			variance -= w[i] * rhs[i];
		}
	} else {
		const u = choleskySolve(a, n, new Float64Array(n).fill(1));
		let sw = 0;
		let su = 0;
		for (let i = 0; i < n; i++) {
			sw += w[i];
			su += u[i];
		}
		const mu = (sw - 1) / su;
		estimate = 0;
		variance = c0 - mu;
		for (let i = 0; i < n; i++) {
			w[i] -= mu * u[i];
			estimate += w[i] * data[i].value;
			variance -= w[i] * rhs[i];
		}
	}
	// Rounding can leave a tiny negative variance next to a datum.
	return { estimate, variance: Math.max(variance, 0), weights: w };
}

function checkDuplicates(data: Sample[]): void {
	const order = data.map((_, i) => i);
	order.sort((a, b) => data[a].x - data[b].x || data[a].y - data[b].y || data[a].z - data[b].z || a - b);
	for (let k = 1; k < order.length; k++) {
		const p = data[order[k - 1]];
		const q = data[order[k]];
		if (p.x === q.x && p.y === q.y && p.z === q.z) {
			const [i, j] = [order[k - 1], order[k]].sort((a, b) => a - b);
			throw new Error(`duplicate sample locations: ${i} and ${j}`);
		}
	}
}
