import { compileVariogram, planRotation, type VariogramModel } from '../geostat';

/** γ(h) of a model along the directions the workspace plots and tabulates. */
export interface ModelCurves {
	/** γ(0, 0, h): along the vertical. */
	vertical: (h: number) => number;
	/** γ(h·sin az, h·cos az, 0): in plan along the azimuth az. */
	horizontal: (h: number) => number;
	/** γ(h·cos az, −h·sin az, 0): in plan across it (az + 90°). */
	minor: (h: number) => number;
}

/**
 * The model's variogram curves: vertical, and horizontal along and across a plan azimuth (degrees clockwise
 * from north; default the model's own major axis), with the engine's compileVariogram and planRotation, so
 * the curve drawn over the bins is the γ a simulation uses in that direction (geometric anisotropy,
 * Deutsch & Journel 1998).
 * @throws the errors of compileVariogram on an invalid model, TypeError on a non-finite azimuth
 */
export function modelCurves(model: VariogramModel, azimuth: number = model.azimuth): ModelCurves {
	const compiled = compileVariogram(model);
	const rot = planRotation(azimuth);
	return {
		vertical: (h) => compiled.gamma(0, 0, h),
		horizontal: (h) => compiled.gamma(h * rot.sin, h * rot.cos, 0),
		minor: (h) => compiled.gamma(h * rot.cos, -h * rot.sin, 0)
	};
}
