import { fitVariogram, type LagBin, type VariogramModel } from '../geostat';
import { modelFromParameters, parametersFromModel } from './model-parameters';
import { modelMisfit } from './model-misfit';
import type { FitRequest, ModelMisfit, ModelParameters } from './types';

export interface AutoFitOptions extends FitRequest {
	minPairs: number;
	/** Plan azimuth the horizontal bins were computed along (0 when omnidirectional). */
	azimuth: number;
	/**
	 * The variance of what is analysed (1 for normal scores; the declustered variance of the values): the
	 * total sill is held at it unless `sill` is 'fit'.
	 */
	variance?: number;
}

/** Bins the automatic fit takes: vertical, horizontal along the azimuth, and (for plan anisotropy) across it. */
export interface AutoFitBins {
	vertical?: LagBin[];
	horizontal?: LagBin[];
	horizontalMinor?: LagBin[] | null;
}

/**
 * Automatic weighted least-squares fit of one structure plus nugget to the vertical and horizontal bins
 * together (fitVariogram; Cressie 1985 weights), returned as editable parameters, the engine model in the
 * workspace's shape (nugget first) and its misfit. By default (`sill` 'variance') the total sill is held at
 * `options.variance`, the variance of what is analysed: sequential Gaussian simulation reproduces the
 * variance of its model's sill, so a normal-score model must have a sill of 1 for the histogram to come back
 * (Deutsch & Journel 1998, ch. V); holding it also keeps the ranges from trading off against a free sill
 * when the lags change. With bins across the azimuth (`horizontalMinor`) the plan ranges are fitted apart
 * (rangeMajor along `azimuth`, rangeMinor across it); without, rangeMinor = rangeMajor.
 * @throws {RangeError} when the sill is to be held and `variance` is not a number > 0; the errors of
 *   fitVariogram (e.g. no bin with enough pairs, a fixed nugget above the variance)
 */
export function autoFit(
	bins: AutoFitBins,
	{ type, nugget, minPairs, azimuth, variance, sill = 'variance' }: AutoFitOptions
): { parameters: ModelParameters; model: VariogramModel; misfit: ModelMisfit } {
	if (sill === 'variance' && !(typeof variance === 'number' && variance > 0 && Number.isFinite(variance))) {
		throw new RangeError('variance must be > 0 to hold the sill at it');
	}
	const input = { vertical: bins.vertical, horizontal: bins.horizontal, ...(bins.horizontalMinor ? { horizontalMinor: bins.horizontalMinor } : {}) };
	const fitted = fitVariogram(input, {
		type,
		nugget: nugget === 'none' ? undefined : nugget,
		sill: sill === 'variance' ? variance : 'fit',
		minPairs,
		azimuth
	});
	const parameters = { ...parametersFromModel(fitted), azimuth };
	// nugget + (variance − nugget) may round away from the variance; a held sill is the variance exactly.
	if (sill === 'variance') parameters.sill = variance!;
	const model = modelFromParameters(parameters);
	return { parameters, model, misfit: modelMisfit(model, bins, minPairs) };
}
