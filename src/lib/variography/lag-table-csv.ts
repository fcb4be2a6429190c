import type { LagBin } from '../geostat';

/**
 * A lag table as CSV with a header row: bin index, nominal lag, mean separation, gamma, pairs, and the
 * model's gamma at the mean separation when `model` is given. Empty bins leave gamma blank.
 * Numbers are written in full (shortest round-trip form) so a spreadsheet gets the engine's values.
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
			String((k + 1) * lag),
			empty ? '' : String(b.h),
			empty ? '' : String(b.gamma),
			String(b.pairs),
			...(model ? [String(model(b.h))] : [])
		].join(',');
	});
	return [head.join(','), ...rows].join('\n') + '\n';
}
