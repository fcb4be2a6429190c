import { significantCell } from '../csv';
import type { LagBin } from '../geostat';

/** Significant figures of separations and semivariances: finer than any fit or plot can use. */
const DIGITS = 4;

/**
 * A lag table as CSV with a header row: bin index, nominal lag, mean separation, gamma, pairs, and the
 * model's gamma at the mean separation when `model` is given. Empty bins leave gamma blank.
 * Rounded for people: the nominal lag as the multiple it is (0.6, not 0.6000000000000001), separations and
 * semivariances to four significant figures, pair counts exact. The full values stay with the saved variogram.
 */
export function lagTableCsv(
	bins: LagBin[],
	{ lag, lengthUnit, model }: { lag: number; lengthUnit: string; model?: (h: number) => number }
): string {
	const head = ['bin', `lag_${lengthUnit}`, `mean_separation_${lengthUnit}`, 'gamma', 'pairs', ...(model ? ['model_gamma'] : [])];
	const rows = bins.map((b, k) => {
		const empty = b.pairs === 0;
		return [
			String(k + 1),
			// Twelve figures drop the binary noise of k × lag and keep any lag a person types.
			significantCell((k + 1) * lag, 12),
			empty ? '' : significantCell(b.h, DIGITS),
			empty ? '' : significantCell(b.gamma, DIGITS),
			String(b.pairs),
			...(model ? [significantCell(model(b.h), DIGITS)] : [])
		].join(',');
	});
	return [head.join(','), ...rows].join('\n') + '\n';
}
