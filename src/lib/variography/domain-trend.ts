import { fitLinearTrend, type LinearTrendFit, type Sample } from '../geostat';
import type { DomainSamplesData, VariogramSettings } from './types';

/**
 * The trend of the mean that settings remove from a domain's samples — the one its variograms were computed
 * on, and so the one a simulation with that variogram must use (DomainInput.trend = domainTrend(…)?.trend):
 * fitLinearTrend over the samples with the declustering weights when `declustered`, equal weights otherwise.
 * Null when the settings remove no trend. Inputs are not mutated.
 * @throws {RangeError} as fitLinearTrend (no samples, weights that do not match)
 * @throws {Error} as fitLinearTrend when the samples do not determine the trend
 */
export function domainTrend(
	data: Pick<DomainSamplesData, 'samples' | 'weights'>,
	settings: Pick<VariogramSettings, 'declustered'> & Partial<Pick<VariogramSettings, 'trend'>>
): LinearTrendFit | null {
	const choice = settings.trend ?? 'none';
	if (choice === 'none') return null;
	const { x, y, z, value } = data.samples;
	const samples: Sample[] = value.map((v, i) => ({ x: x[i], y: y[i], z: z[i], value: v }));
	return fitLinearTrend(samples, settings.declustered ? data.weights : undefined, choice);
}
