import type { Sample } from '../types';
import type { TargetPoints } from '../simulation/types';
import { COINCIDENCE_TOLERANCE } from '../simulation/prepare-simulation';

/** Result of dataReproduction. */
export interface DataReproduction {
	/** Largest |realization − datum| over the targets at a datum (0 when none); NaN if such a target is NaN. */
	maxError: number;
	/** Number of (target, datum) pairs compared. */
	count: number;
}

/**
 * Data reproduction of a realization (Deutsch & Journel 1998, ch. V; Leuangthong, McLennan & Deutsch 2004,
 * "Minimum acceptance criteria for geostatistical realizations"): the largest absolute difference between
 * the realization and each datum at the targets within `tolerance` of it (default COINCIDENCE_TOLERANCE).
 * A conditional simulation honours its data, so this is 0. Does not mutate its inputs.
 * @throws {RangeError} if the realization's length differs from the targets'
 */
export function dataReproduction(
	realization: ArrayLike<number>,
	targets: TargetPoints,
	samples: Sample[],
	tolerance = COINCIDENCE_TOLERANCE
): DataReproduction {
	const n = targets.x.length;
	if (realization.length !== n) throw new RangeError('realization and targets differ in length');
	const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => targets.x[a] - targets.x[b] || a - b);
	const xs = Float64Array.from(order, (i) => targets.x[i]);
	let maxError = 0;
	let count = 0;
	for (const s of samples) {
		let lo = 0;
		let hi = n;
		while (lo < hi) {
			const mid = (lo + hi) >> 1;
			if (xs[mid] < s.x - tolerance) lo = mid + 1;
			else hi = mid;
		}
		for (let p = lo; p < n && xs[p] <= s.x + tolerance; p++) {
			const g = order[p];
			if (targets.domain[g] < 0) continue;
			if (Math.abs(targets.y[g] - s.y) > tolerance || Math.abs(targets.z[g] - s.z) > tolerance) continue;
			const e = Math.abs(realization[g] - s.value);
			count++;
			if (Number.isNaN(e)) maxError = NaN;
			else if (e > maxError) maxError = e;
		}
	}
	return { maxError, count };
}
