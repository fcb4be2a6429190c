import { fitVariogram, type FitInput, type VariogramModel } from '../geostat';
import { modelFromParameters, parametersFromModel } from './model-parameters';
import { modelMisfit } from './model-misfit';
import type { FitRequest, ModelMisfit, ModelParameters } from './types';

export interface AutoFitOptions extends FitRequest {
	minPairs: number;
	/** Plan azimuth the horizontal bins were computed along (0 when omnidirectional). */
	azimuth: number;
}

/**
 * Automatic weighted least-squares fit of one structure plus nugget to the vertical and horizontal bins
 * together (fitVariogram; Cressie 1985 weights), returned as editable parameters, the engine model in the
 * workspace's shape (nugget first) and its misfit.
 * @throws the errors of fitVariogram (e.g. no bin with enough pairs)
 */
export function autoFit(bins: FitInput, { type, nugget, minPairs, azimuth }: AutoFitOptions): {
	parameters: ModelParameters;
	model: VariogramModel;
	misfit: ModelMisfit;
} {
	const fitted = fitVariogram(bins, { type, nugget: nugget === 'none' ? undefined : nugget, minPairs });
	const parameters = { ...parametersFromModel(fitted), azimuth };
	const model = modelFromParameters(parameters);
	return { parameters, model, misfit: modelMisfit(model, bins, minPairs) };
}
