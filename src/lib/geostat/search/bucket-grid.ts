/**
 * A static bucket grid over points given in a search ellipsoid's normalised frame (see
 * normalisedCoordinates), answering "which points lie within distance 1 of q" (inside the ellipsoid).
 * Buckets are stored compactly (counting sort into one index array), so a grid of n points costs O(n)
 * memory; the bucket size adapts so that there are at most about 2n + 1024 buckets (n + 1024 when fine).
 */
export class BucketGrid {
	readonly size: number;
	/** The points' normalised coordinates, 3 per point (by reference). */
	readonly p: Float64Array;
	/** The grid's lower corner, its number of buckets per axis and the buckets' edge length. */
	readonly lo = new Float64Array(3);
	readonly dims = new Int32Array(3);
	readonly cell: number;
	/** Bucket b holds items[start[b] … start[b + 1] − 1], ascending point indices. */
	readonly start: Int32Array;
	private readonly items: Int32Array;
	/** The bucket of each point. */
	readonly bucketOfPoint: Int32Array;

	/**
	 * @param coords normalised coordinates, 3 per point (u, v, w); kept by reference, not copied or mutated
	 * @param fine buckets of about one point each (for a nearest-first search, ActiveBuckets) instead of buckets
	 *   at least half the search radius wide (for queries of radius 1, `query`)
	 * @throws {RangeError} if coords is not a whole number of points or holds a non-finite value
	 */
	constructor(coords: Float64Array, { fine = false }: { fine?: boolean } = {}) {
		if (coords.length % 3 !== 0) throw new RangeError('coords must hold 3 values per point');
		const n = coords.length / 3;
		this.size = n;
		this.p = coords;
		const hi = [-Infinity, -Infinity, -Infinity];
		const lo = [Infinity, Infinity, Infinity];
		for (let i = 0; i < coords.length; i++) {
			const v = coords[i];
			if (!Number.isFinite(v)) throw new RangeError('coordinates must be finite');
			const a = i % 3;
			if (v < lo[a]) lo[a] = v;
			if (v > hi[a]) hi[a] = v;
		}
		if (n === 0) lo.fill(0), hi.fill(0);
		const count = (c: number) => [0, 1, 2].reduce((m, a) => m * (Math.floor((hi[a] - lo[a]) / c) + 1), 1);
		const most = fine ? n + 1024 : 2 * n + 1024;
		let cell = fine ? Math.max(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2], 1e-6) * 1e-4 : 0.5;
		while (count(cell) > most) cell *= 1.25;
		this.cell = cell;
		for (let a = 0; a < 3; a++) {
			this.lo[a] = lo[a];
			this.dims[a] = Math.floor((hi[a] - lo[a]) / cell) + 1;
		}
		const nb = this.dims[0] * this.dims[1] * this.dims[2];
		const start = new Int32Array(nb + 1);
		const ids = new Int32Array(n);
		for (let i = 0; i < n; i++) {
			ids[i] = this.bucketOf(coords[3 * i], coords[3 * i + 1], coords[3 * i + 2]);
			start[ids[i] + 1]++;
		}
		for (let b = 0; b < nb; b++) start[b + 1] += start[b];
		const fill = start.slice(0, nb);
		const items = new Int32Array(n);
		// Ascending point order inside each bucket keeps query output order independent of anything but the input.
		for (let i = 0; i < n; i++) items[fill[ids[i]]++] = i;
		this.start = start;
		this.items = items;
		this.bucketOfPoint = ids;
	}

	/** The bucket holding (u, v, w), clamped to the grid. */
	bucketOf(u: number, v: number, w: number): number {
		const c = this.cell;
		const i = Math.min(this.dims[0] - 1, Math.floor((u - this.lo[0]) / c));
		const j = Math.min(this.dims[1] - 1, Math.floor((v - this.lo[1]) / c));
		const k = Math.min(this.dims[2] - 1, Math.floor((w - this.lo[2]) / c));
		return (i * this.dims[1] + j) * this.dims[2] + k;
	}

	/**
	 * Writes the indices of the points within normalised distance `r` (default 1) of (u, v, w), and their
	 * squared distances, into outIdx / outD2 (each of length ≥ size); returns how many. Order: by bucket,
	 * then by index — callers that rank by distance sort with the index as tie-break.
	 */
	query(u: number, v: number, w: number, outIdx: Int32Array, outD2: Float64Array, r = 1): number {
		if (this.size === 0) return 0;
		const c = this.cell;
		const [d0, d1, d2] = this.dims;
		const i0 = Math.max(0, Math.floor((u - r - this.lo[0]) / c));
		const i1 = Math.min(d0 - 1, Math.floor((u + r - this.lo[0]) / c));
		const j0 = Math.max(0, Math.floor((v - r - this.lo[1]) / c));
		const j1 = Math.min(d1 - 1, Math.floor((v + r - this.lo[1]) / c));
		const k0 = Math.max(0, Math.floor((w - r - this.lo[2]) / c));
		const k1 = Math.min(d2 - 1, Math.floor((w + r - this.lo[2]) / c));
		const r2 = r * r;
		const p = this.p;
		const start = this.start;
		const items = this.items;
		let m = 0;
		for (let i = i0; i <= i1; i++) {
			for (let j = j0; j <= j1; j++) {
				const row = (i * d1 + j) * d2;
				for (let k = k0; k <= k1; k++) {
					const b = row + k;
					for (let t = start[b], e = start[b + 1]; t < e; t++) {
						const id = items[t];
						const du = p[3 * id] - u;
						const dv = p[3 * id + 1] - v;
						const dw = p[3 * id + 2] - w;
						const dd = du * du + dv * dv + dw * dw;
						if (dd <= r2) {
							outIdx[m] = id;
							outD2[m] = dd;
							m++;
						}
					}
				}
			}
		}
		return m;
	}
}
