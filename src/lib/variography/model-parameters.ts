import type { VariogramModel } from '../geostat';
import type { ModelParameters } from './types';

/**
 * The engine model of editable parameters: a nugget structure (listed first, even when 0, so a saved model
 * always has the same shape) plus one structure with sill − nugget, the two plan ranges along and across the
 * azimuth and the vertical range.
 * @throws {RangeError} on a negative nugget, a sill below the nugget, or a range that is not > 0
 */
export function modelFromParameters(p: ModelParameters): VariogramModel {
	if (!(p.nugget >= 0) || !Number.isFinite(p.nugget)) throw new RangeError('nugget must be >= 0');
	if (!(p.sill >= p.nugget) || !Number.isFinite(p.sill)) throw new RangeError('sill must be >= nugget');
	if (![p.rangeVertical, p.rangeMajor, p.rangeMinor].every((r) => r > 0 && Number.isFinite(r))) throw new RangeError('ranges must be > 0');
	return {
		azimuth: Number.isFinite(p.azimuth) ? p.azimuth : 0,
		structures: [
			{ type: 'nugget', sill: p.nugget, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
			{ type: p.type, sill: p.sill - p.nugget, rangeMajor: p.rangeMajor, rangeMinor: p.rangeMinor, rangeVertical: p.rangeVertical }
		]
	};
}

/**
 * Editable parameters of an engine model with at most one nugget and one other structure (what
 * fitVariogram returns and modelFromParameters builds).
 * @throws {RangeError} if the model has no non-nugget structure or more than one
 */
export function parametersFromModel(model: VariogramModel): ModelParameters {
	const nuggets = model.structures.filter((s) => s.type === 'nugget');
	const others = model.structures.filter((s) => s.type !== 'nugget');
	if (others.length !== 1 || nuggets.length > 1) throw new RangeError('model must have one structure and at most one nugget');
	const s = others[0];
	const nugget = nuggets[0]?.sill ?? 0;
	return {
		type: s.type as ModelParameters['type'],
		nugget,
		sill: nugget + s.sill,
		rangeVertical: s.rangeVertical,
		rangeMajor: s.rangeMajor,
		rangeMinor: s.rangeMinor,
		azimuth: model.azimuth
	};
}
