import sin from '@stdlib/math-base-special-sin';
import cos from '@stdlib/math-base-special-cos';
import type { ExperimentalOptions, LagBin, Sample } from '../types';

const DEG = Math.PI / 180;

/**
 * Experimental (semi)variogram γ(h) = ½·mean((vᵢ − vⱼ)²) over the pairs of each lag bin
 * (Matheron's estimator; Isaaks & Srivastava 1989, ch. 7; Deutsch & Journel 1998, ch. III).
 * Bin k = 1..nLags holds the pairs with |h − k·lag| ≤ lagTolerance (default lag/2; a pair on the boundary
 * of two bins counts in both); `h` of a bin is the mean separation of its pairs. Each unordered pair counts once.
 *
 * Directions:
 * - 'vertical': pairs within one sounding only (samples without a sounding are left out), h = |dz|.
 *   Each sounding is sorted by z and swept with a window of nLags·lag + lagTolerance, so the cost is
 *   proportional to the pairs in range, not to n².
 * - 'horizontal': pairs from different soundings with |dz| ≤ verticalBand (default 0.1), h = plan distance.
 *   A sample without a sounding counts as its own sounding. With `azimuth` (degrees clockwise from +y), only
 *   pairs within angleTolerance (default 22.5°) of that plan direction, either way, and within `bandwidth`
 *   (default Infinity) of its line. Samples are sorted by z and swept within the band.
 * - { azimuth, dip }: 3D direction, dip in degrees positive downward (z is up); all pairs, any sounding, with
 *   h = 3D distance, within angleTolerance of the direction, |offset in plan| ≤ bandwidth and
 *   |offset in the direction's vertical plane| ≤ verticalBandwidth. Samples are sorted by their projection
 *   on the direction and swept.
 *
 * Always returns nLags bins; an empty bin has pairs 0, gamma NaN and h = k·lag (its nominal centre, for
 * plotting). Samples are not mutated.
 * @throws {TypeError} if samples is not an array or the direction is unknown
 * @throws {RangeError} on non-finite coordinates or values, lag not > 0, nLags not a positive integer,
 *   lagTolerance not > 0, verticalBand < 0, angleTolerance outside (0, 90], bandwidths not > 0
 */
export function experimentalVariogram(samples: Sample[], opts: ExperimentalOptions): LagBin[] {
	if (!Array.isArray(samples)) throw new TypeError('samples must be an array');
	if (opts === null || typeof opts !== 'object') throw new TypeError('options must be an object');
	const {
		direction,
		lag,
		nLags,
		lagTolerance = lag / 2,
		verticalBand = 0.1,
		azimuth,
		angleTolerance = 22.5,
		bandwidth = Infinity,
		verticalBandwidth = Infinity
	} = opts;
	if (!(lag > 0) || !Number.isFinite(lag)) throw new RangeError('lag must be > 0');
	if (!Number.isInteger(nLags) || nLags < 1) throw new RangeError('nLags must be a positive integer');
	if (!(lagTolerance > 0) || !Number.isFinite(lagTolerance)) throw new RangeError('lagTolerance must be > 0');
	if (!(verticalBand >= 0)) throw new RangeError('verticalBand must be >= 0');
	if (!(angleTolerance > 0 && angleTolerance <= 90)) throw new RangeError('angleTolerance must be in (0, 90]');
	if (!(bandwidth > 0) || !(verticalBandwidth > 0)) throw new RangeError('bandwidth must be > 0');
	for (const s of samples) {
		if (!Number.isFinite(s.x) || !Number.isFinite(s.y) || !Number.isFinite(s.z) || !Number.isFinite(s.value)) {
			throw new RangeError('sample coordinates and values must be finite');
		}
	}
	const acc = new Accumulator(lag, nLags, lagTolerance);
	if (direction === 'vertical') {
		vertical(samples, acc);
	} else if (direction === 'horizontal') {
		let rot: { s: number; c: number; cosTol: number } | null = null;
		if (azimuth !== undefined) {
			if (typeof azimuth !== 'number' || !Number.isFinite(azimuth)) throw new TypeError('azimuth must be a finite number');
			rot = { s: sin(azimuth * DEG), c: cos(azimuth * DEG), cosTol: cos(angleTolerance * DEG) };
		}
		horizontal(samples, acc, verticalBand, rot, bandwidth);
	} else if (direction !== null && typeof direction === 'object' && Number.isFinite(direction.azimuth) && Number.isFinite(direction.dip)) {
		oriented(samples, acc, direction.azimuth, direction.dip, angleTolerance, bandwidth, verticalBandwidth);
	} else {
		throw new TypeError("direction must be 'vertical', 'horizontal' or { azimuth, dip }");
	}
	return acc.bins();
}

class Accumulator {
	readonly maxH: number;
	private readonly count: Float64Array;
	private readonly sumH: Float64Array;
	private readonly sumSq: Float64Array;

	constructor(
		private readonly lag: number,
		private readonly nLags: number,
		private readonly tol: number
	) {
		this.maxH = nLags * lag + tol;
		this.count = new Float64Array(nLags + 1);
		this.sumH = new Float64Array(nLags + 1);
		this.sumSq = new Float64Array(nLags + 1);
	}

	add(h: number, d2: number): void {
		const { lag, tol, nLags } = this;
		// Candidate bins from the division, widened by one each way; the exact test decides.
		const k0 = Math.max(1, Math.ceil((h - tol) / lag) - 1);
		const k1 = Math.min(nLags, Math.floor((h + tol) / lag) + 1);
		for (let k = k0; k <= k1; k++) {
			if (Math.abs(h - k * lag) <= tol) {
				this.count[k]++;
				this.sumH[k] += h;
				this.sumSq[k] += d2;
			}
		}
	}

	bins(): LagBin[] {
		const out: LagBin[] = [];
		for (let k = 1; k <= this.nLags; k++) {
			const n = this.count[k];
			out.push(n > 0 ? { h: this.sumH[k] / n, gamma: this.sumSq[k] / (2 * n), pairs: n } : { h: k * this.lag, gamma: NaN, pairs: 0 });
		}
		return out;
	}
}

function sortedBy(key: Float64Array, idx: number[]): number[] {
	// The index tie-break makes the pair order, hence the floating-point sums, independent of input ties.
	return idx.sort((a, b) => key[a] - key[b] || a - b);
}

function vertical(samples: Sample[], acc: Accumulator): void {
	const groups = new Map<string, number[]>();
	for (let i = 0; i < samples.length; i++) {
		const id = samples[i].sounding;
		if (id === undefined) continue;
		const g = groups.get(id);
		if (g) g.push(i);
		else groups.set(id, [i]);
	}
	const zAll = new Float64Array(samples.length);
	for (let i = 0; i < samples.length; i++) zAll[i] = samples[i].z;
	const maxH = acc.maxH;
	for (const idx of groups.values()) {
		const order = sortedBy(zAll, idx);
		const m = order.length;
		const z = new Float64Array(m);
		const v = new Float64Array(m);
		for (let i = 0; i < m; i++) {
			z[i] = samples[order[i]].z;
			v[i] = samples[order[i]].value;
		}
		for (let i = 0; i < m; i++) {
			for (let j = i + 1; j < m; j++) {
				const h = z[j] - z[i];
				if (h > maxH) break;
				const d = v[j] - v[i];
				acc.add(h, d * d);
			}
		}
	}
}

function horizontal(
	samples: Sample[],
	acc: Accumulator,
	band: number,
	rot: { s: number; c: number; cosTol: number } | null,
	bandwidth: number
): void {
	const n = samples.length;
	const zAll = new Float64Array(n);
	for (let i = 0; i < n; i++) zAll[i] = samples[i].z;
	const order = sortedBy(zAll, Array.from({ length: n }, (_, i) => i));
	const ids = new Map<string, number>();
	const x = new Float64Array(n);
	const y = new Float64Array(n);
	const z = new Float64Array(n);
	const v = new Float64Array(n);
	const sid = new Int32Array(n);
	for (let i = 0; i < n; i++) {
		const s = samples[order[i]];
		x[i] = s.x;
		y[i] = s.y;
		z[i] = s.z;
		v[i] = s.value;
		if (s.sounding === undefined) {
			sid[i] = -1 - i;
		} else {
			let k = ids.get(s.sounding);
			if (k === undefined) ids.set(s.sounding, (k = ids.size));
			sid[i] = k;
		}
	}
	const maxH2 = acc.maxH * acc.maxH;
	for (let i = 0; i < n; i++) {
		for (let j = i + 1; j < n; j++) {
			if (z[j] - z[i] > band) break;
			if (sid[i] === sid[j]) continue;
			const dx = x[j] - x[i];
			const dy = y[j] - y[i];
			const h2 = dx * dx + dy * dy;
			if (h2 > maxH2) continue;
			const h = Math.sqrt(h2);
			if (rot !== null) {
				const u = dx * rot.s + dy * rot.c;
				const w = dx * rot.c - dy * rot.s;
				if (Math.abs(u) < h * rot.cosTol || Math.abs(w) > bandwidth) continue;
			}
			const d = v[j] - v[i];
			acc.add(h, d * d);
		}
	}
}

function oriented(
	samples: Sample[],
	acc: Accumulator,
	azimuth: number,
	dip: number,
	angleTolerance: number,
	bandwidth: number,
	verticalBandwidth: number
): void {
	const sa = sin(azimuth * DEG);
	const ca = cos(azimuth * DEG);
	const sd = sin(dip * DEG);
	const cd = cos(dip * DEG);
	// Orthonormal frame: d along the direction (dip down, z up), p across it in plan, q across it in its vertical plane.
	const dX = sa * cd;
	const dY = ca * cd;
	const dZ = -sd;
	const qX = sa * sd;
	const qY = ca * sd;
	const qZ = cd;
	const cosTol = cos(angleTolerance * DEG);
	const n = samples.length;
	const tAll = new Float64Array(n);
	for (let i = 0; i < n; i++) tAll[i] = samples[i].x * dX + samples[i].y * dY + samples[i].z * dZ;
	const order = sortedBy(tAll, Array.from({ length: n }, (_, i) => i));
	const x = new Float64Array(n);
	const y = new Float64Array(n);
	const z = new Float64Array(n);
	const v = new Float64Array(n);
	const t = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const s = samples[order[i]];
		x[i] = s.x;
		y[i] = s.y;
		z[i] = s.z;
		v[i] = s.value;
		t[i] = tAll[order[i]];
	}
	const maxH = acc.maxH;
	const maxH2 = maxH * maxH;
	for (let i = 0; i < n; i++) {
		for (let j = i + 1; j < n; j++) {
			// |projection| ≤ distance, so pairs beyond the window along d cannot be in range.
			if (t[j] - t[i] > maxH) break;
			const dx = x[j] - x[i];
			const dy = y[j] - y[i];
			const dz = z[j] - z[i];
			const h2 = dx * dx + dy * dy + dz * dz;
			if (h2 > maxH2) continue;
			const h = Math.sqrt(h2);
			const along = dx * dX + dy * dY + dz * dZ;
			if (Math.abs(along) < h * cosTol) continue;
			if (Math.abs(dx * ca - dy * sa) > bandwidth) continue;
			if (Math.abs(dx * qX + dy * qY + dz * qZ) > verticalBandwidth) continue;
			const d = v[j] - v[i];
			acc.add(h, d * d);
		}
	}
}
