import type { Sample } from '../types';

/** Cell dimensions along x, y and z (each > 0; Infinity means one cell along that axis). */
export interface CellSize {
	x: number;
	y: number;
	z: number;
}

/**
 * Cell declustering weights (Deutsch 1989, Computers & Geosciences 15(3)): a grid of cells anchored at the
 * samples' minimum coordinates; each sample's weight is proportional to 1 / (number of samples in its cell),
 * and the weights sum to 1 (so each occupied cell carries equal total weight). Samples are not mutated.
 * @throws {TypeError} if samples is not an array or cell is malformed
 * @throws {RangeError} on no samples, a non-finite coordinate, or a cell size that is not > 0
 */
export function cellDeclusterWeights(samples: Sample[], cell: CellSize): Float64Array {
	if (!Array.isArray(samples)) throw new TypeError('samples must be an array');
	if (samples.length === 0) throw new RangeError('no samples');
	checkCell(cell);
	const n = samples.length;
	let x0 = Infinity;
	let y0 = Infinity;
	let z0 = Infinity;
	for (const s of samples) {
		if (!Number.isFinite(s.x) || !Number.isFinite(s.y) || !Number.isFinite(s.z)) {
			throw new RangeError('coordinates must be finite');
		}
		if (s.x < x0) x0 = s.x;
		if (s.y < y0) y0 = s.y;
		if (s.z < z0) z0 = s.z;
	}
	const keys: string[] = new Array(n);
	const counts = new Map<string, number>();
	for (let i = 0; i < n; i++) {
		const s = samples[i];
		// An infinite cell size puts every sample in cell 0 along that axis ((v − v0)/∞ = 0).
		const k = `${Math.floor((s.x - x0) / cell.x)},${Math.floor((s.y - y0) / cell.y)},${Math.floor((s.z - z0) / cell.z)}`;
		keys[i] = k;
		counts.set(k, (counts.get(k) ?? 0) + 1);
	}
	const cells = counts.size;
	const w = new Float64Array(n);
	for (let i = 0; i < n; i++) w[i] = 1 / (counts.get(keys[i])! * cells);
	return w;
}

function checkCell(cell: CellSize): void {
	if (cell === null || typeof cell !== 'object') throw new TypeError('cell must be { x, y, z }');
	for (const k of ['x', 'y', 'z'] as const) {
		if (typeof cell[k] !== 'number') throw new TypeError('cell must be { x, y, z }');
		if (!(cell[k] > 0)) throw new RangeError('cell sizes must be > 0');
	}
}
