/**
 * Weighted summary statistics for declustered distributions (Isaaks & Srivastava 1989, ch. 10;
 * Deutsch & Journel 1998). Weights need not sum to 1; they are normalised. Inputs are not mutated.
 */

function check(values: ArrayLike<number>, weights: ArrayLike<number> | undefined): Float64Array {
	if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
		throw new TypeError('values must be array-like');
	}
	const n = values.length;
	if (n === 0) throw new RangeError('no values');
	for (let i = 0; i < n; i++) {
		if (typeof values[i] !== 'number' || !Number.isFinite(values[i])) throw new RangeError('values must be finite');
	}
	const w = new Float64Array(n);
	if (weights === undefined) return w.fill(1);
	if (weights === null || typeof weights !== 'object' || typeof weights.length !== 'number') {
		throw new TypeError('weights must be array-like');
	}
	if (weights.length !== n) throw new RangeError('weights length must match values');
	let total = 0;
	for (let i = 0; i < n; i++) {
		const wi = weights[i];
		if (typeof wi !== 'number' || !(wi >= 0) || !Number.isFinite(wi)) throw new RangeError('weights must be >= 0');
		w[i] = wi;
		total += wi;
	}
	if (!(total > 0)) throw new RangeError('weights must not all be 0');
	return w;
}

/**
 * Weighted mean Σwᵢxᵢ / Σwᵢ.
 * @throws {TypeError} if values or weights are not array-like
 * @throws {RangeError} on empty input, non-finite values, a length mismatch, negative or all-zero weights
 */
export function weightedMean(values: ArrayLike<number>, weights?: ArrayLike<number>): number {
	const w = check(values, weights);
	let sw = 0;
	let s = 0;
	for (let i = 0; i < w.length; i++) {
		sw += w[i];
		s += w[i] * values[i];
	}
	return s / sw;
}

/**
 * Weighted population variance Σwᵢ(xᵢ − m)² / Σwᵢ (two-pass, so large offsets do not cancel).
 * With equal weights this is the population variance (divisor n), the usual choice for a declustered
 * histogram that stands for the whole domain.
 * @throws as weightedMean
 */
export function weightedVariance(values: ArrayLike<number>, weights?: ArrayLike<number>): number {
	const w = check(values, weights);
	let sw = 0;
	let s = 0;
	for (let i = 0; i < w.length; i++) {
		sw += w[i];
		s += w[i] * values[i];
	}
	const m = s / sw;
	let ss = 0;
	for (let i = 0; i < w.length; i++) {
		const d = values[i] - m;
		ss += w[i] * d * d;
	}
	return ss / sw;
}

/**
 * Plotting positions of a weighted sample: its distinct values ascending, each at the midpoint of its
 * cumulative-weight step, p = (Σ weights of smaller values + ½ its own weight) / Σ weights. Tied values
 * share one step. With equal weights this is Hyndman & Fan (1996) definition 5, p = (i − ½)/n; normalScore
 * scores the same positions. Zero-weight values are left out. These are the points of a weighted empirical
 * CDF, and weightedQuantiles interpolates between them.
 * @throws as weightedMean
 */
export function weightedPlottingPositions(
	values: ArrayLike<number>,
	weights?: ArrayLike<number>
): { values: Float64Array; p: Float64Array } {
	return positions(values, check(values, weights));
}

/**
 * Weighted quantiles at probabilities ps: linear interpolation between the weighted plotting positions
 * (weightedPlottingPositions, the same positions as normalScore); the smallest / largest value outside them.
 * Zero-weight values are ignored.
 * @throws as weightedMean, and RangeError if a probability is outside [0, 1] or NaN
 */
export function weightedQuantiles(
	values: ArrayLike<number>,
	weights: ArrayLike<number> | undefined,
	ps: ArrayLike<number>
): Float64Array {
	const w = check(values, weights);
	for (let k = 0; k < ps.length; k++) {
		if (!(ps[k] >= 0 && ps[k] <= 1)) throw new RangeError('probabilities must be in [0, 1]');
	}
	const { values: xs, p: pp } = positions(values, w);
	const out = new Float64Array(ps.length);
	const m = xs.length;
	for (let k = 0; k < ps.length; k++) {
		const p = ps[k];
		if (p <= pp[0]) out[k] = xs[0];
		else if (p >= pp[m - 1]) out[k] = xs[m - 1];
		else {
			let lo = 0;
			let hi = m - 1;
			while (hi - lo > 1) {
				const mid = (lo + hi) >> 1;
				if (pp[mid] <= p) lo = mid;
				else hi = mid;
			}
			out[k] = p === pp[lo] ? xs[lo] : xs[lo] + ((xs[hi] - xs[lo]) * (p - pp[lo])) / (pp[hi] - pp[lo]);
		}
	}
	return out;
}

/** Distinct values with positive weight, ascending, at the midpoints of their cumulative-weight steps; `w` is checked. */
function positions(values: ArrayLike<number>, w: Float64Array): { values: Float64Array; p: Float64Array } {
	const order: number[] = [];
	for (let i = 0; i < w.length; i++) if (w[i] > 0) order.push(i);
	order.sort((a, b) => values[a] - values[b] || a - b);
	let total = 0;
	for (const i of order) total += w[i];
	const xs: number[] = [];
	const pp: number[] = [];
	let cum = 0;
	let i = 0;
	while (i < order.length) {
		const v = values[order[i]];
		let g = 0;
		while (i < order.length && values[order[i]] === v) g += w[order[i++]];
		xs.push(v);
		pp.push((cum + g / 2) / total);
		cum += g;
	}
	return { values: Float64Array.from(xs), p: Float64Array.from(pp) };
}
