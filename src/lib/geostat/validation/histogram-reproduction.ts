import { weightedQuantiles } from '../statistics/weighted';

/** Result of histogramReproduction. */
export interface HistogramReproduction {
	probabilities: Float64Array;
	/** Quantiles of the realization values. */
	simulated: Float64Array;
	/** Quantiles of the (declustered) data. */
	reference: Float64Array;
	/** Largest |simulated − reference| over the probabilities. */
	maxError: number;
}

/**
 * Histogram reproduction (Deutsch & Journel 1998, ch. V; Leuangthong et al. 2004): quantiles of the
 * realization values (NaN entries skipped) against the declustered data quantiles, both by
 * weightedQuantiles (midpoint plotting positions). Does not mutate its inputs.
 * @throws {RangeError} if no realization value is finite, and as weightedQuantiles
 */
export function histogramReproduction(
	realization: ArrayLike<number>,
	data: ArrayLike<number>,
	weights?: ArrayLike<number>,
	probabilities: ArrayLike<number> = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95]
): HistogramReproduction {
	const vals: number[] = [];
	for (let i = 0; i < realization.length; i++) if (Number.isFinite(realization[i])) vals.push(realization[i]);
	if (vals.length === 0) throw new RangeError('realization has no finite values');
	const simulated = weightedQuantiles(vals, undefined, probabilities);
	const reference = weightedQuantiles(data, weights, probabilities);
	let maxError = 0;
	for (let k = 0; k < simulated.length; k++) maxError = Math.max(maxError, Math.abs(simulated[k] - reference[k]));
	return { probabilities: Float64Array.from(probabilities), simulated, reference, maxError };
}
