import { weightedMean, weightedQuantiles, weightedVariance } from '../geostat';

/** Summary of a domain's (declustered) distribution. */
export interface DomainStats {
	n: number;
	mean: number;
	sd: number;
	p10: number;
	p50: number;
	p90: number;
}

/**
 * n, weighted mean, weighted population standard deviation and P10/P50/P90 (the engine's weighted statistics,
 * Isaaks & Srivastava 1989 ch. 10; quantiles at the weighted plotting positions); NaN when there are no values.
 * @throws as weightedMean (unequal lengths, non-finite values, negative or all-zero weights)
 */
export function domainStatistics(values: ArrayLike<number>, weights: ArrayLike<number>): DomainStats {
	if (values.length === 0) return { n: 0, mean: NaN, sd: NaN, p10: NaN, p50: NaN, p90: NaN };
	const [p10, p50, p90] = weightedQuantiles(values, weights, [0.1, 0.5, 0.9]);
	return {
		n: values.length,
		mean: weightedMean(values, weights),
		sd: Math.sqrt(weightedVariance(values, weights)),
		p10,
		p50,
		p90
	};
}
