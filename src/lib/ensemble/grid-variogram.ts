/** The experimental variogram of a gridded field along one grid axis, at whole multiples of the spacing. */
export interface GridVariogramLag {
	/** Separation: steps × spacing along the axis. */
	h: number;
	steps: number;
	gamma: number;
	pairs: number;
}

/**
 * Matheron's estimator γ(h) = Σ (v(u) − v(u + h))² / (2·N(h)) on a regular grid (row-major, x fastest, then y,
 * then z), pairing each cell with the cell `steps` cells further along `axis`, for every given number of steps;
 * only pairs whose two cells are both in `include` count (Deutsch & Journel 1998, ch. III.1; Isaaks &
 * Srivastava 1989, ch. 7). On a grid the lags are exact, so no lag tolerance is needed. A lag without pairs has
 * gamma NaN. Does not mutate its inputs.
 * @throws {RangeError} if the values or mask do not match the counts, or a step count is not a positive integer
 */
export function gridVariogram(
	values: ArrayLike<number>,
	include: ArrayLike<boolean | number>,
	counts: { x: number; y: number; z: number },
	spacing: { x: number; y: number; z: number },
	axis: 'x' | 'y' | 'z',
	steps: number[]
): GridVariogramLag[] {
	const { x: nx, y: ny, z: nz } = counts;
	const n = nx * ny * nz;
	if (values.length !== n || include.length !== n) throw new RangeError('values and mask must match the grid counts');
	for (const s of steps) if (!Number.isInteger(s) || s < 1) throw new RangeError('steps must be positive integers');
	const stride = axis === 'x' ? 1 : axis === 'y' ? nx : nx * ny;
	const along = axis === 'x' ? nx : axis === 'y' ? ny : nz;
	return steps.map((s) => {
		let sum = 0;
		let pairs = 0;
		if (s < along) {
			for (let k = 0; k < nz; k++) {
				for (let j = 0; j < ny; j++) {
					for (let i = 0; i < nx; i++) {
						const pos = axis === 'x' ? i : axis === 'y' ? j : k;
						if (pos + s >= along) continue;
						const a = i + nx * (j + ny * k);
						const b = a + s * stride;
						if (!include[a] || !include[b]) continue;
						const d = values[a] - values[b];
						sum += d * d;
						pairs++;
					}
				}
			}
		}
		return { h: s * spacing[axis], steps: s, gamma: pairs ? sum / (2 * pairs) : NaN, pairs };
	});
}
