import type { NormalScoreTable } from '../types';
import { inverseNormalCdf } from './normal';

/** Cumulative probability of the linear tails' anchors: the tails reach zmin / zmax at Φ⁻¹(TAIL_P) / Φ⁻¹(1 − TAIL_P). */
export const TAIL_P = 1e-6;
const LOW_ANCHOR = inverseNormalCdf(TAIL_P);
// By symmetry of Φ; written so because 1 − 1e-6 is not exact in binary.
const HIGH_ANCHOR = -LOW_ANCHOR;

/** Options of normalScore. */
export interface NormalScoreOptions {
	/** Value of the lower tail (≤ smallest datum); default the smallest datum. */
	zmin?: number;
	/** Value of the upper tail (≥ largest datum); default the largest datum. */
	zmax?: number;
	/** 'linear' (default) or 'clamp'. */
	tail?: 'linear' | 'clamp';
}

/**
 * Normal-score transform (Deutsch & Journel 1998, ch. V; Goovaerts 1997, ch. 7).
 * Values are sorted; weights (default equal) are normalised to sum 1; each value's score is Φ⁻¹ of the
 * midpoint of its cumulative-weight interval, and tied values share the score of the midpoint of their
 * combined interval. With equal weights the i-th of n distinct values gets Φ⁻¹((i − ½)/n).
 *
 * Returns the scores in input order (a new array; inputs are not mutated) and the table that
 * backTransform uses: the distinct values with their scores, and the tail rule.
 * @throws {TypeError} if values or weights are not array-like
 * @throws {RangeError} on empty input, a non-finite value, a weights length mismatch, a non-positive or
 *   non-finite weight, or zmin/zmax inside the data
 */
export function normalScore(
	values: ArrayLike<number>,
	weights?: ArrayLike<number>,
	opts: NormalScoreOptions = {}
): { scores: Float64Array; table: NormalScoreTable } {
	if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
		throw new TypeError('values must be array-like');
	}
	const n = values.length;
	if (n === 0) throw new RangeError('no values');
	for (let i = 0; i < n; i++) {
		if (typeof values[i] !== 'number' || !Number.isFinite(values[i])) throw new RangeError('values must be finite');
	}
	const w = new Float64Array(n);
	if (weights === undefined) {
		w.fill(1);
	} else {
		if (weights === null || typeof weights !== 'object' || typeof weights.length !== 'number') {
			throw new TypeError('weights must be array-like');
		}
		if (weights.length !== n) throw new RangeError('weights length must match values');
		for (let i = 0; i < n; i++) {
			const wi = weights[i];
			// Zero weights would give Φ⁻¹(0) = −∞ to an extreme value; leave such samples out instead.
			if (typeof wi !== 'number' || !(wi > 0) || !Number.isFinite(wi)) throw new RangeError('weights must be positive');
			w[i] = wi;
		}
	}
	const { tail = 'linear' } = opts;
	if (tail !== 'linear' && tail !== 'clamp') throw new RangeError("tail must be 'linear' or 'clamp'");

	const order = Array.from({ length: n }, (_, i) => i);
	order.sort((a, b) => values[a] - values[b] || a - b);
	let total = 0;
	for (let i = 0; i < n; i++) total += w[order[i]];

	const distinct: number[] = [];
	const distinctScores: number[] = [];
	const scores = new Float64Array(n);
	let cum = 0;
	let i = 0;
	while (i < n) {
		const v = values[order[i]];
		let j = i;
		let groupWeight = 0;
		while (j < n && values[order[j]] === v) groupWeight += w[order[j++]];
		// Clamp guards against rounding of the running sum pushing the midpoint to 0 or 1.
		const p = Math.min(Math.max((cum + groupWeight / 2) / total, Number.MIN_VALUE), 1 - Number.EPSILON / 2);
		const y = inverseNormalCdf(p);
		for (let k = i; k < j; k++) scores[order[k]] = y;
		distinct.push(v);
		distinctScores.push(y);
		cum += groupWeight;
		i = j;
	}
	const lo = distinct[0];
	const hi = distinct[distinct.length - 1];
	const { zmin = lo, zmax = hi } = opts;
	if (typeof zmin !== 'number' || !Number.isFinite(zmin) || zmin > lo) throw new RangeError('zmin must be <= the smallest value');
	if (typeof zmax !== 'number' || !Number.isFinite(zmax) || zmax < hi) throw new RangeError('zmax must be >= the largest value');
	return {
		scores,
		table: {
			values: Float64Array.from(distinct),
			scores: Float64Array.from(distinctScores),
			zmin,
			zmax,
			tail
		}
	};
}

/**
 * Back-transform of a normal score y to the data scale through a normal-score table
 * (Deutsch & Journel 1998, ch. V). Returns values[i] exactly at scores[i] and interpolates linearly
 * between neighbouring pairs, so it is monotone non-decreasing in y. Beyond the data:
 * - 'clamp': the smallest / largest value;
 * - 'linear': linear from (scores[0], values[0]) to (Φ⁻¹(1e-6), zmin), and zmin below that; likewise up to
 *   (Φ⁻¹(1 − 1e-6), zmax). If the first (last) score is already beyond its anchor, the tail is zmin (zmax).
 * NaN gives NaN. Table contents are trusted (built by normalScore).
 * @throws {TypeError} if y is not a number
 */
export function backTransform(table: NormalScoreTable, y: number): number {
	if (typeof y !== 'number') throw new TypeError('y must be a number');
	if (Number.isNaN(y)) return NaN;
	const { values, scores } = table;
	const m = scores.length;
	if (y <= scores[0]) {
		if (y === scores[0] || table.tail === 'clamp') return values[0];
		const y0 = LOW_ANCHOR;
		if (y <= y0 || scores[0] <= y0) return table.zmin;
		return Math.min(values[0], table.zmin + ((values[0] - table.zmin) * (y - y0)) / (scores[0] - y0));
	}
	if (y >= scores[m - 1]) {
		if (y === scores[m - 1] || table.tail === 'clamp') return values[m - 1];
		const y1 = HIGH_ANCHOR;
		if (y >= y1 || scores[m - 1] >= y1) return table.zmax;
		return Math.min(table.zmax, values[m - 1] + ((table.zmax - values[m - 1]) * (y - scores[m - 1])) / (y1 - scores[m - 1]));
	}
	// Binary search for scores[lo] <= y < scores[lo + 1].
	let lo = 0;
	let hi = m - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (scores[mid] <= y) lo = mid;
		else hi = mid;
	}
	if (y === scores[lo]) return values[lo];
	const v = values[lo] + ((values[hi] - values[lo]) * (y - scores[lo])) / (scores[hi] - scores[lo]);
	// Rounding could step one ulp past the next knot; keep the transform monotone.
	return Math.min(v, values[hi]);
}
