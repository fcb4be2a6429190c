import type { NormalScoreTable } from '../types';
import { weightedPlottingPositions } from '../statistics/weighted';
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
 * combined interval — the weighted plotting positions of weightedPlottingPositions, which weightedQuantiles
 * and the domains' CDFs use too. With equal weights the i-th of n distinct values gets Φ⁻¹((i − ½)/n).
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
	if (weights !== null && typeof weights === 'object' && typeof weights.length === 'number') {
		// Zero weights would give Φ⁻¹(0) = −∞ to an extreme value; leave such samples out instead.
		for (let i = 0; i < weights.length; i++) {
			if (typeof weights[i] !== 'number' || !(weights[i] > 0) || !Number.isFinite(weights[i])) throw new RangeError('weights must be positive');
		}
	}
	const { tail = 'linear' } = opts;
	if (tail !== 'linear' && tail !== 'clamp') throw new RangeError("tail must be 'linear' or 'clamp'");
	const { values: distinct, p } = weightedPlottingPositions(values, weights);
	const m = distinct.length;
	const distinctScores = new Float64Array(m);
	for (let k = 0; k < m; k++) {
		// Clamp guards against rounding of the running sum pushing the midpoint to 0 or 1.
		distinctScores[k] = inverseNormalCdf(Math.min(Math.max(p[k], Number.MIN_VALUE), 1 - Number.EPSILON / 2));
	}
	const scores = new Float64Array(values.length);
	for (let i = 0; i < values.length; i++) scores[i] = distinctScores[indexOf(distinct, values[i])];
	const lo = distinct[0];
	const hi = distinct[m - 1];
	const { zmin = lo, zmax = hi } = opts;
	if (typeof zmin !== 'number' || !Number.isFinite(zmin) || zmin > lo) throw new RangeError('zmin must be <= the smallest value');
	if (typeof zmax !== 'number' || !Number.isFinite(zmax) || zmax < hi) throw new RangeError('zmax must be >= the largest value');
	return { scores, table: { values: distinct, scores: distinctScores, zmin, zmax, tail } };
}

/** Index of v in the ascending distinct values `sorted` (v is one of them). */
function indexOf(sorted: Float64Array, v: number): number {
	let lo = 0;
	let hi = sorted.length - 1;
	while (lo < hi) {
		const mid = (lo + hi) >> 1;
		if (sorted[mid] < v) lo = mid + 1;
		else hi = mid;
	}
	return lo;
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
