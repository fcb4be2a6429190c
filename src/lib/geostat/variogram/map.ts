import type { Sample } from '../types';

/** Options of experimentalVariogramMap. */
export interface VariogramMapOptions {
	/** Cell size of the map in plan (> 0). */
	lag: number;
	/** Cells each way from the centre: the map covers offsets −nLags·lag … +nLags·lag along x and y. */
	nLags: number;
	/** Largest |dz| of a pair; default 0.1. */
	verticalBand?: number;
}

/**
 * A variogram map: γ over plan offsets (dx, dy), on a square of size × size cells centred on offset 0,
 * stored row-major with x fastest: cell (i, j) at index j·size + i holds offsets near
 * ((i − nLags)·lag, (j − nLags)·lag). Columns are Float64Array; an empty cell has pairs 0, gamma NaN and its
 * nominal offset.
 */
export interface VariogramMap {
	lag: number;
	nLags: number;
	/** 2·nLags + 1. */
	size: number;
	/** Mean offsets of the cell's pairs (east, north). */
	dx: Float64Array;
	dy: Float64Array;
	gamma: Float64Array;
	pairs: Float64Array;
}

/**
 * Experimental variogram map in plan (Isaaks & Srivastava 1989, ch. 7, the "contour map of γ"; Deutsch &
 * Journel 1998, ch. III): γ = ½·mean((vᵢ − vⱼ)²) of the pairs whose plan offset falls in each cell, for pairs
 * from different soundings with |dz| ≤ verticalBand, as for a horizontal variogram. Each unordered pair
 * counts at (dx, dy) and at (−dx, −dy), so the map is symmetric through its centre. The direction of
 * greatest continuity shows as the axis along which γ stays low longest. A pair is in the cell of
 * round(dx/lag), round(dy/lag) (Math.round: a half-way offset rounds upward).
 * Samples are not mutated.
 * @throws {TypeError} if samples is not an array
 * @throws {RangeError} on non-finite coordinates or values, lag not > 0, nLags not a positive integer,
 *   verticalBand < 0, or a map of more than 1 000 000 cells
 */
export function experimentalVariogramMap(samples: Sample[], opts: VariogramMapOptions): VariogramMap {
	if (!Array.isArray(samples)) throw new TypeError('samples must be an array');
	if (opts === null || typeof opts !== 'object') throw new TypeError('options must be an object');
	const { lag, nLags, verticalBand = 0.1 } = opts;
	if (!(lag > 0) || !Number.isFinite(lag)) throw new RangeError('lag must be > 0');
	if (!Number.isInteger(nLags) || nLags < 1) throw new RangeError('nLags must be a positive integer');
	if (!(verticalBand >= 0)) throw new RangeError('verticalBand must be >= 0');
	const size = 2 * nLags + 1;
	if (size * size > 1_000_000) throw new RangeError('map too large');
	for (const s of samples) {
		if (!Number.isFinite(s.x) || !Number.isFinite(s.y) || !Number.isFinite(s.z) || !Number.isFinite(s.value)) {
			throw new RangeError('sample coordinates and values must be finite');
		}
	}
	const cells = size * size;
	const count = new Float64Array(cells);
	const sumDx = new Float64Array(cells);
	const sumDy = new Float64Array(cells);
	const sumSq = new Float64Array(cells);

	const n = samples.length;
	// Sorted by z (ties by index, so the sums run in a fixed order) and swept within the band.
	const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => samples[a].z - samples[b].z || a - b);
	const x = new Float64Array(n);
	const y = new Float64Array(n);
	const z = new Float64Array(n);
	const v = new Float64Array(n);
	const sid = new Int32Array(n);
	const ids = new Map<string, number>();
	for (let i = 0; i < n; i++) {
		const s = samples[order[i]];
		x[i] = s.x;
		y[i] = s.y;
		z[i] = s.z;
		v[i] = s.value;
		if (s.sounding === undefined) sid[i] = -1 - i;
		else {
			let k = ids.get(s.sounding);
			if (k === undefined) ids.set(s.sounding, (k = ids.size));
			sid[i] = k;
		}
	}
	const reach = (nLags + 0.5) * lag;
	const add = (c: number, dx: number, dy: number, d2: number) => {
		count[c]++;
		sumDx[c] += dx;
		sumDy[c] += dy;
		sumSq[c] += d2;
	};
	for (let i = 0; i < n; i++) {
		for (let j = i + 1; j < n; j++) {
			if (z[j] - z[i] > verticalBand) break;
			if (sid[i] === sid[j]) continue;
			const dx = x[j] - x[i];
			const dy = y[j] - y[i];
			if (Math.abs(dx) >= reach || Math.abs(dy) >= reach) continue;
			const ci = Math.round(dx / lag);
			const cj = Math.round(dy / lag);
			if (ci < -nLags || ci > nLags || cj < -nLags || cj > nLags) continue;
			const d = v[j] - v[i];
			const d2 = d * d;
			add((cj + nLags) * size + ci + nLags, dx, dy, d2);
			add((nLags - cj) * size + nLags - ci, -dx, -dy, d2);
		}
	}
	const map: VariogramMap = {
		lag,
		nLags,
		size,
		dx: new Float64Array(cells),
		dy: new Float64Array(cells),
		gamma: new Float64Array(cells),
		pairs: count
	};
	for (let c = 0; c < cells; c++) {
		const k = count[c];
		if (k > 0) {
			map.dx[c] = sumDx[c] / k;
			map.dy[c] = sumDy[c] / k;
			map.gamma[c] = sumSq[c] / (2 * k);
		} else {
			map.dx[c] = ((c % size) - nLags) * lag;
			map.dy[c] = (Math.floor(c / size) - nLags) * lag;
			map.gamma[c] = NaN;
		}
	}
	return map;
}
