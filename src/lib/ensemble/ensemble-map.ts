/** The ensemble maps a recipe's N realizations summarise to, one value a target. */
export const ENSEMBLE_STATS = ['mean', 'sd', 'p10', 'p50', 'p90', 'below'] as const;
export type EnsembleStat = (typeof ENSEMBLE_STATS)[number];

const PROBABILITY: Partial<Record<EnsembleStat, number>> = { p10: 0.1, p50: 0.5, p90: 0.9 };

/**
 * An ensemble map over realizations given in realization order (0, 1, …, N − 1), target by target
 * (Deutsch & Journel 1998, ch. IV and V; Goovaerts 1997, ch. 7–8, "post-processing" of realizations):
 * - `mean`: the E-type estimate, Σᵣ vᵣ / N, summed in realization order;
 * - `sd`: the ensemble standard deviation √(Σᵣ (vᵣ − mean)² / N) (population form, divisor N);
 * - `p10`, `p50`, `p90`: quantiles of the N values at the midpoint plotting positions (j − ½)/N, linear in
 *   between and the smallest / largest value beyond (Hyndman & Fan 1996, definition 5; the engine's
 *   weightedQuantiles with equal weights);
 * - `below`: the fraction of realizations with a value strictly below `threshold`.
 * NaN where a realization is NaN (a target that is not simulated). Only +, −, ×, ÷ and √ in a fixed order, so
 * a browser and the server compute the same bits from the same realizations. Does not mutate its inputs.
 * @throws {RangeError} with no realizations, unequal lengths, an unknown stat, or 'below' without a finite threshold
 */
export function ensembleMap(realizations: ArrayLike<number>[], stat: EnsembleStat, threshold?: number): Float64Array {
	const n = realizations.length;
	if (n === 0) throw new RangeError('no realizations');
	const cells = realizations[0].length;
	for (const r of realizations) if (r.length !== cells) throw new RangeError('realizations differ in length');
	if (!(ENSEMBLE_STATS as readonly string[]).includes(stat)) throw new RangeError(`unknown stat ${String(stat)}`);
	if (stat === 'below' && (threshold === undefined || !Number.isFinite(threshold))) throw new RangeError('below needs a finite threshold');
	const out = new Float64Array(cells);
	const p = PROBABILITY[stat];
	const scratch = new Float64Array(n);
	for (let i = 0; i < cells; i++) {
		let nan = false;
		for (let r = 0; r < n; r++) {
			const v = realizations[r][i];
			if (v !== v) {
				nan = true;
				break;
			}
			scratch[r] = v;
		}
		if (nan) {
			out[i] = NaN;
			continue;
		}
		if (stat === 'mean' || stat === 'sd') {
			let s = 0;
			for (let r = 0; r < n; r++) s += scratch[r];
			const m = s / n;
			if (stat === 'mean') out[i] = m;
			else {
				let ss = 0;
				for (let r = 0; r < n; r++) ss += (scratch[r] - m) * (scratch[r] - m);
				out[i] = Math.sqrt(ss / n);
			}
		} else if (stat === 'below') {
			let k = 0;
			for (let r = 0; r < n; r++) if (scratch[r] < threshold!) k++;
			out[i] = k / n;
		} else {
			scratch.sort();
			out[i] = midpointQuantile(scratch, p!);
		}
	}
	return out;
}

/**
 * Quantile p of sorted values at the plotting positions (j + ½)/n (j from 0), linear between them, tied values
 * keeping their own positions (Hyndman & Fan 1996, definition 5); the ensemble's quantiles, used by ensembleMap
 * and weakZones.
 */
export function midpointQuantile(sorted: Float64Array, p: number): number {
	const n = sorted.length;
	const f = p * n - 0.5;
	if (f <= 0) return sorted[0];
	if (f >= n - 1) return sorted[n - 1];
	const j = Math.floor(f);
	const t = f - j;
	return sorted[j] + t * (sorted[j + 1] - sorted[j]);
}
