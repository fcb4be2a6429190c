import exp from '@stdlib/math-base-special-exp';
import ln from '@stdlib/math-base-special-ln';
import type { FitInput, LagBin, VariogramModel } from '../geostat';
import { misfitOrNull } from './model-misfit';
import type { Misfit, RangeSensitivity } from './types';

export interface SensitivityOptions {
	/**
	 * Which range is varied, against which bins: 'vertical' (rangeVertical, vertical bins), 'horizontal' (both
	 * plan ranges together, bins along the major axis: the isotropic case, default), 'major' or 'minor' (one
	 * plan range, bins along or across the azimuth).
	 */
	direction?: RangeSensitivity['direction'];
	minPairs?: number;
	/** Curve from range·from to range·to (defaults 0.25 and 4). */
	from?: number;
	to?: number;
	/** Points on the curve, log-spaced (default 25, odd so the model's own range is on it). */
	points?: number;
	/**
	 * The admitted ranges keep the misfit per bin below base + max(relative·base, perBin), base the model's
	 * misfit per bin; default ADMITTED_TOLERANCE.
	 */
	tolerance?: { relative: number; perBin: number };
}

/**
 * How far the misfit per bin may rise above the fitted model's before a range counts as worse than the fit:
 * by half, or by 1 where the fit is already close (whichever is more). Cressie's weights N/γ̂² are about
 * 2/Var(γ̂) for Gaussian data (Var(γ̂) ≈ 2γ²/N with independent pairs; Cressie 1985), so a correct model
 * leaves a misfit of about 2 per bin from the scatter of γ̂ alone; a rise of 1 per bin is half that, and a
 * rise by half is a plain, visible change on the sensitivity plot. Neighbouring bins share pairs, so the
 * χ²-based intervals of least squares (which assume independent bins) would be far too narrow.
 * Measured on exactly simulated fields (tests/variography/fit-recovery.test.ts): the ranges fitted with
 * other numbers of lags or lag tolerances of the same data fall within the admitted intervals.
 */
export const ADMITTED_TOLERANCE = { relative: 0.5, perBin: 1 };

/** The scan that finds the admitted interval: ⅛ to 8 times the range, 3.5 % steps. */
const SCAN_FROM = 1 / 8;
const SCAN_TO = 8;
const SCAN_POINTS = 121;

/**
 * Range sensitivity of one direction: the weighted misfit of its bins (variogramMisfit, Cressie 1985 weights)
 * with its range multiplied by ½ and by 2, everything else held, a log-spaced curve of the misfit per bin
 * against the range, and the interval of ranges the data admit (misfit per bin within the tolerance of the
 * model's: ADMITTED_TOLERANCE). A flat curve and a wide interval mean the data hardly constrain the range, as is common for
 * horizontal ranges where soundings are tens of metres apart (common practice).
 * Returns null when no bin has minPairs pairs. The model is not mutated.
 * @throws {RangeError} if the model has no structure with a finite range in that direction, or a bad option
 */
export function rangeSensitivity(model: VariogramModel, bins: LagBin[], opts: SensitivityOptions = {}): RangeSensitivity | null {
	const { direction = 'horizontal', minPairs = 30, from = 0.25, to = 4, points = 25, tolerance = ADMITTED_TOLERANCE } = opts;
	if (!(from > 0 && to > from) || !Number.isInteger(points) || points < 2 || !(tolerance.relative >= 0) || !(tolerance.perBin >= 0)) {
		throw new RangeError('bad curve options');
	}
	const key = direction === 'vertical' ? 'rangeVertical' : direction === 'minor' ? 'rangeMinor' : 'rangeMajor';
	const structured = model.structures.find((s) => s.type !== 'nugget' && Number.isFinite(s[key]));
	if (!structured) throw new RangeError(`model has no ${direction === 'vertical' ? 'vertical' : 'horizontal'} range`);
	const range = structured[key];
	const input: FitInput = direction === 'vertical' ? { vertical: bins } : direction === 'minor' ? { horizontalMinor: bins } : { horizontal: bins };
	const at = (factor: number): Misfit | null => misfitOrNull(scaled(model, direction, factor), input, minPairs);
	const base = at(1);
	if (base === null) return null;
	const curve: { range: number; perBin: number }[] = [];
	const a = ln(from);
	const b = ln(to);
	for (let i = 0; i < points; i++) {
		const f = exp(a + ((b - a) * i) / (points - 1));
		curve.push({ range: range * f, perBin: at(f)!.perBin });
	}
	const limit = base.perBin + Math.max(tolerance.relative * base.perBin, tolerance.perBin);
	return { direction, range, base, halved: at(0.5)!, doubled: at(2)!, curve, admitted: admitted(at, range, limit) };
}

/** Walks the log scan out from the model's range each way while the misfit per bin stays within the limit. */
function admitted(at: (f: number) => Misfit | null, range: number, limit: number): RangeSensitivity['admitted'] {
	const a = ln(SCAN_FROM);
	const b = ln(SCAN_TO);
	const mid = (SCAN_POINTS - 1) / 2;
	const factor = (i: number) => (i === mid ? 1 : exp(a + ((b - a) * i) / (SCAN_POINTS - 1)));
	let lo = mid;
	while (lo > 0 && at(factor(lo - 1))!.perBin <= limit) lo--;
	let hi = mid;
	while (hi < SCAN_POINTS - 1 && at(factor(hi + 1))!.perBin <= limit) hi++;
	return { low: range * factor(lo), high: range * factor(hi), lowOpen: lo === 0, highOpen: hi === SCAN_POINTS - 1, limit };
}

function scaled(model: VariogramModel, direction: RangeSensitivity['direction'], f: number): VariogramModel {
	return {
		azimuth: model.azimuth,
		structures: model.structures.map((s) => {
			if (s.type === 'nugget') return { ...s };
			if (direction === 'vertical') return { ...s, rangeVertical: s.rangeVertical * f };
			if (direction === 'major') return { ...s, rangeMajor: s.rangeMajor * f };
			if (direction === 'minor') return { ...s, rangeMinor: s.rangeMinor * f };
			return { ...s, rangeMajor: s.rangeMajor * f, rangeMinor: s.rangeMinor * f };
		})
	};
}
