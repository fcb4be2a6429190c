import { normalScore, trendResiduals, weightedMean, weightedVariance, type LinearTrendFit, type Sample } from '../geostat';
import { domainTrend } from './domain-trend';
import type { DomainSamplesData, VariogramSettings } from './types';

/** The samples an experimental variogram is computed on, with the statistics of the analysed values. */
export interface PreparedSamples {
	samples: Sample[];
	variance: number;
	mean: number;
	soundings: number;
	/** The trend removed before the transform; null without one. */
	trend: LinearTrendFit | null;
}

/**
 * Turns a domain's sample columns into engine samples of the analysed variable: the property's values, or
 * their residuals from a linear trend of the mean (`settings.trend`, fitted by weighted least squares with
 * the declustering weights when `declustered`: domainTrend), then as they are (transform 'none') or as
 * their normal scores ('normal-score'; Deutsch & Journel 1998, ch. V) computed with the same weights.
 * The variance returned is that of the analysed values, weighted by the declustering weights when
 * `declustered` (population variance, the sill reference of common practice). Inputs are not mutated.
 * @throws {TypeError} if the columns are missing
 * @throws {RangeError} if the columns differ in length, there are no samples, or (declustered) a weight is not > 0
 * @throws {Error} as fitLinearTrend when the samples do not determine the trend
 */
export function prepareSamples(
	data: Pick<DomainSamplesData, 'samples' | 'weights'>,
	settings: Pick<VariogramSettings, 'transform' | 'declustered'> & Partial<Pick<VariogramSettings, 'trend'>>
): PreparedSamples {
	const cols = data?.samples;
	if (!cols || !Array.isArray(cols.x) || !Array.isArray(cols.z) || !Array.isArray(cols.value)) {
		throw new TypeError('samples must hold x, y, z, value and sounding columns');
	}
	const n = cols.value.length;
	if (n === 0) throw new RangeError('no samples');
	for (const c of [cols.x, cols.y, cols.z, cols.sounding]) {
		if (!Array.isArray(c) || c.length !== n) throw new RangeError('sample columns must have equal lengths');
	}
	let weights: number[] | undefined;
	if (settings.declustered) {
		if (!Array.isArray(data.weights) || data.weights.length !== n) throw new RangeError('weights must match the samples');
		weights = data.weights;
	}
	const samples: Sample[] = new Array(n);
	for (let i = 0; i < n; i++) samples[i] = { x: cols.x[i], y: cols.y[i], z: cols.z[i], value: cols.value[i], sounding: cols.sounding[i] };
	const trend = domainTrend(data, settings);
	const raw = trend ? trendResiduals(samples, trend.trend) : cols.value;
	const values = settings.transform === 'normal-score' ? normalScore(raw, weights).scores : Float64Array.from(raw);
	for (let i = 0; i < n; i++) samples[i].value = values[i];
	return {
		samples,
		variance: weightedVariance(values, weights),
		mean: weightedMean(values, weights),
		soundings: new Set(cols.sounding).size,
		trend
	};
}
