import { variogramMisfit, type FitInput, type VariogramModel } from '../geostat';
import type { Misfit, ModelMisfit } from './types';

/**
 * The weighted misfit Σ N(h)/γ̂(h)² · (γ̂(h) − γ(h))² (Cressie 1985) of a model, over all directions and
 * each direction alone (vertical, horizontal along the major axis, across it), with variogramMisfit's bins
 * and weights. A direction without a bin of at least minPairs pairs gives null rather than an error, so a
 * page can show what there is. Null bins count as absent.
 */
export function modelMisfit(
	model: VariogramModel,
	bins: { vertical?: FitInput['vertical']; horizontal?: FitInput['horizontal']; horizontalMinor?: FitInput['horizontalMinor'] | null },
	minPairs = 30
): ModelMisfit {
	const all: FitInput = { vertical: bins.vertical, horizontal: bins.horizontal, ...(bins.horizontalMinor ? { horizontalMinor: bins.horizontalMinor } : {}) };
	return {
		total: misfitOrNull(model, all, minPairs),
		vertical: bins.vertical ? misfitOrNull(model, { vertical: bins.vertical }, minPairs) : null,
		horizontal: bins.horizontal ? misfitOrNull(model, { horizontal: bins.horizontal }, minPairs) : null,
		minor: bins.horizontalMinor ? misfitOrNull(model, { horizontalMinor: bins.horizontalMinor }, minPairs) : null
	};
}

/** variogramMisfit with the per-bin figure, or null when no bin qualifies. Model errors still throw. */
export function misfitOrNull(model: VariogramModel, bins: FitInput, minPairs: number): Misfit | null {
	try {
		const { wss, bins: n } = variogramMisfit(model, bins, { minPairs });
		return { wss, bins: n, perBin: wss / n };
	} catch (err) {
		if (err instanceof Error && !(err instanceof TypeError) && !(err instanceof RangeError)) return null;
		throw err;
	}
}
