import { weightedPlottingPositions } from '../geostat';

/** An empirical CDF: distinct values ascending with their cumulative probabilities. */
export interface Cdf {
	value: number[];
	p: number[];
}

/**
 * A weighted empirical CDF: distinct values ascending, each at the midpoint of its cumulative-weight step,
 * p = (Σ earlier weights + ½ own weight) / Σ weights — the engine's weightedPlottingPositions, which
 * weightedQuantiles and normalScore use too, so P50 read off the curve matches the statistics table and the
 * normal scores. Zero weights are left out; empty input gives empty arrays.
 * @throws {RangeError} on unequal lengths, a non-finite value or a negative weight
 */
export function weightedCdf(values: ArrayLike<number>, weights: ArrayLike<number>): Cdf {
	if (values.length !== weights.length) throw new RangeError('values and weights lengths differ');
	if (values.length === 0) return { value: [], p: [] };
	const { values: v, p } = weightedPlottingPositions(values, weights);
	return { value: Array.from(v), p: Array.from(p) };
}
