import type { BucketGrid } from './bucket-grid';

/**
 * The points of a BucketGrid that have become active (simulated nodes, added one at a time along a random path),
 * searched outward from a query point bucket shell by bucket shell (Chebyshev rings of buckets), stopping as soon
 * as the shells searched hold every active point nearer than the k-th found. It returns candidates, not a
 * ranking: a subset of the active points within distance r of q (squared distances computed exactly as
 * BucketGrid.query computes them) that contains the k nearest of them in the order (squared distance, index). A
 * caller that ranks the candidates (selectNearest) therefore chooses exactly what it would choose from all active
 * points within r — the same neighbours, the same bits — while looking at a few buckets instead of every point in
 * the search ellipsoid (whose count grows with the density of the targets: tens of thousands on a fine mesh).
 *
 * Why the stop is exact: a point in shell s + 1 or beyond differs from q's bucket by s + 1 buckets along some axis,
 * so it is farther than s·cell from q along that axis alone. After shell s, every active point within s·cell is a
 * candidate; once k candidates lie within it, no point outside can rank among the k nearest. A relative margin of
 * 1e-9 on s·cell keeps this true under the rounding of the bucket computation.
 */
export class ActiveBuckets {
	private readonly filled: Int32Array;
	private readonly slots: Int32Array;

	constructor(private readonly grid: BucketGrid) {
		this.filled = new Int32Array(grid.start.length - 1);
		this.slots = new Int32Array(grid.size);
	}

	/** Makes no point active. */
	clear(): void {
		this.filled.fill(0);
	}

	/** Makes point `id` active (each at most once between clears). */
	add(id: number): void {
		const b = this.grid.bucketOfPoint[id];
		this.slots[this.grid.start[b] + this.filled[b]++] = id;
	}

	/**
	 * Writes candidates among the active points within normalised distance `r` of (u, v, w) into outIdx / outD2
	 * (each of length ≥ the grid's size): every one of the k nearest (by squared distance, then index), and maybe
	 * others. Returns how many.
	 */
	candidates(u: number, v: number, w: number, k: number, outIdx: Int32Array, outD2: Float64Array, r = 1): number {
		const g = this.grid;
		if (g.size === 0) return 0;
		const c = g.cell;
		const [d0, d1, d2] = g.dims;
		const clamp = (x: number, hi: number) => (x < 0 ? 0 : x > hi ? hi : x);
		const i0 = clamp(Math.floor((u - g.lo[0]) / c), d0 - 1);
		const j0 = clamp(Math.floor((v - g.lo[1]) / c), d1 - 1);
		const k0 = clamp(Math.floor((w - g.lo[2]) / c), d2 - 1);
		const r2 = r * r;
		const p = g.p;
		const start = g.start;
		const filled = this.filled;
		const slots = this.slots;
		let m = 0;
		const scan = (b: number) => {
			for (let t = start[b], e = t + filled[b]; t < e; t++) {
				const id = slots[t];
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
		};
		for (let s = 0; ; s++) {
			const ia = Math.max(0, i0 - s);
			const ib = Math.min(d0 - 1, i0 + s);
			const ja = Math.max(0, j0 - s);
			const jb = Math.min(d1 - 1, j0 + s);
			const ka = Math.max(0, k0 - s);
			const kb = Math.min(d2 - 1, k0 + s);
			for (let i = ia; i <= ib; i++) {
				const onI = i === i0 - s || i === i0 + s;
				for (let j = ja; j <= jb; j++) {
					const row = (i * d1 + j) * d2;
					if (onI || j === j0 - s || j === j0 + s) {
						for (let kk = ka; kk <= kb; kk++) scan(row + kk);
					} else {
						// Inside the ring in i and j: only the two faces in k belong to shell s.
						if (k0 - s >= 0) scan(row + k0 - s);
						if (s > 0 && k0 + s < d2) scan(row + k0 + s);
					}
				}
			}
			// Every bucket searched, or every point within r found: done.
			if (ia === 0 && ib === d0 - 1 && ja === 0 && jb === d1 - 1 && ka === 0 && kb === d2 - 1) return m;
			const reach = s * c * (1 - 1e-9);
			if (reach >= r) return m;
			if (m >= k) {
				const lim = reach * reach;
				let inside = 0;
				for (let t = 0; t < m && inside < k; t++) if (outD2[t] <= lim) inside++;
				if (inside >= k) return m;
			}
		}
	}
}
