/** How a lookup table's output must run with its input. */
export type Monotonic = 'increasing' | 'decreasing' | 'none';

/** A modeller's own piecewise-linear relation: points (input, output), inputs strictly increasing. */
export interface LookupTable {
	points: readonly (readonly [number, number])[];
	monotonic: Monotonic;
}

/** A looked-up value and whether the input lay beyond the table (−1 below its first point, 1 above its last, 0 within). */
export interface LookedUp {
	value: number;
	held: -1 | 0 | 1;
}

/**
 * Checks a lookup table and says what is wrong with it, or null when it is usable: at least two points, every
 * number finite, inputs strictly increasing, and outputs that never fall ('increasing') or never rise
 * ('decreasing') when the table says so (e.g. a modulus that must grow with density).
 */
export function lookupTableProblem(table: LookupTable): string | null {
	const { points, monotonic } = table;
	if (points.length < 2) return 'A table needs at least two points.';
	for (let i = 0; i < points.length; i++) {
		const [x, y] = points[i];
		if (!Number.isFinite(x) || !Number.isFinite(y)) return `Point ${i + 1} is not a pair of finite numbers.`;
		if (i === 0) continue;
		const [px, py] = points[i - 1];
		if (!(x > px)) return `The inputs must increase: point ${i + 1} (${x}) is not above point ${i} (${px}).`;
		if (monotonic === 'increasing' && y < py) return `The outputs must not fall: point ${i + 1} (${y}) is below point ${i} (${py}).`;
		if (monotonic === 'decreasing' && y > py) return `The outputs must not rise: point ${i + 1} (${y}) is above point ${i} (${py}).`;
	}
	return null;
}

/**
 * The table's output at x by linear interpolation between the two points around it; beyond the table the output
 * is held at the end point's (`held` says which end, so callers can count such values). NaN gives NaN (held 0).
 * The table must pass lookupTableProblem; it is not checked again here (this runs per element).
 */
export function lookUp(table: LookupTable, x: number): LookedUp {
	const p = table.points;
	if (x !== x) return { value: NaN, held: 0 };
	const n = p.length;
	if (x < p[0][0]) return { value: p[0][1], held: -1 };
	if (x > p[n - 1][0]) return { value: p[n - 1][1], held: 1 };
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (p[mid][0] <= x) lo = mid;
		else hi = mid;
	}
	const [x0, y0] = p[lo];
	const [x1, y1] = p[hi];
	if (x === x1) return { value: y1, held: 0 };
	return { value: y0 + ((y1 - y0) * (x - x0)) / (x1 - x0), held: 0 };
}
