import exp from '@stdlib/math-base-special-exp';
import ln from '@stdlib/math-base-special-ln';
import type { LagBin, VariogramModel } from '../geostat';
import { misfitOrNull } from './model-misfit';
import type { Misfit, RangeSensitivity } from './types';

export interface SensitivityOptions {
	minPairs?: number;
	/** Curve from range·from to range·to (defaults 0.25 and 4). */
	from?: number;
	to?: number;
	/** Points on the curve, log-spaced (default 25, odd so the model's own range is on it). */
	points?: number;
}

/**
 * Range sensitivity: the weighted misfit of the horizontal bins (variogramMisfit, Cressie 1985 weights) with
 * every horizontal range of the model multiplied by ½ and by 2, everything else held, and a log-spaced
 * curve of the per-bin misfit against the horizontal range. A flat curve means the data hardly constrain
 * the horizontal range, as is common where soundings are tens of metres apart (common practice).
 * Returns null when no horizontal bin has minPairs pairs. The model is not mutated.
 * @throws {RangeError} if the model has no structure with a finite horizontal range, or a bad curve option
 */
export function rangeSensitivity(model: VariogramModel, horizontal: LagBin[], opts: SensitivityOptions = {}): RangeSensitivity | null {
	const { minPairs = 30, from = 0.25, to = 4, points = 25 } = opts;
	if (!(from > 0 && to > from) || !Number.isInteger(points) || points < 2) throw new RangeError('bad curve options');
	const structured = model.structures.find((s) => s.type !== 'nugget' && Number.isFinite(s.rangeMajor));
	if (!structured) throw new RangeError('model has no horizontal range');
	const range = structured.rangeMajor;
	const at = (factor: number): Misfit | null => misfitOrNull(scaled(model, factor), { horizontal }, minPairs);
	const base = at(1);
	if (base === null) return null;
	const curve: { range: number; perBin: number }[] = [];
	const a = ln(from);
	const b = ln(to);
	for (let i = 0; i < points; i++) {
		const f = exp(a + ((b - a) * i) / (points - 1));
		curve.push({ range: range * f, perBin: at(f)!.perBin });
	}
	return { range, base, halved: at(0.5)!, doubled: at(2)!, curve };
}

function scaled(model: VariogramModel, f: number): VariogramModel {
	return {
		azimuth: model.azimuth,
		structures: model.structures.map((s) => (s.type === 'nugget' ? { ...s } : { ...s, rangeMajor: s.rangeMajor * f, rangeMinor: s.rangeMinor * f }))
	};
}
