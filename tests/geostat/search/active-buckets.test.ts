/**
 * ActiveBuckets against brute force: from its candidates, selectNearest chooses exactly what it chooses from every
 * active point within the radius — at every stage of a random activation order, in 2D and 3D, for queries inside and
 * outside the points' box, with duplicate points (ties broken by index), radii below and above the bucket size, and
 * k larger than the active count.
 */
import { describe, expect, it } from 'vitest';
import { ActiveBuckets, BucketGrid, selectNearest } from '../../../src/lib/geostat/index';

function lcg(seed: number) {
	let s = seed;
	return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

function chosen(idx: Int32Array, d2: Float64Array, m: number, k: number): number[] {
	const oi = new Int32Array(Math.max(k, 1));
	const od = new Float64Array(Math.max(k, 1));
	const n = selectNearest(idx, d2, m, k, oi, od);
	return Array.from(oi.subarray(0, n));
}

/** Every active point within r of q, as BucketGrid.query computes the squared distances. */
function bruteForce(p: Float64Array, active: number[], q: number[], r: number, idx: Int32Array, d2: Float64Array): number {
	let m = 0;
	for (const id of active) {
		const du = p[3 * id] - q[0];
		const dv = p[3 * id + 1] - q[1];
		const dw = p[3 * id + 2] - q[2];
		const dd = du * du + dv * dv + dw * dw;
		if (dd <= r * r) {
			idx[m] = id;
			d2[m] = dd;
			m++;
		}
	}
	return m;
}

function check(name: string, p: Float64Array, seed: number, radii: number[], ks: number[]) {
	const n = p.length / 3;
	const rnd = lcg(seed);
	const order = Array.from({ length: n }, (_, i) => i);
	for (let i = n - 1; i > 0; i--) {
		const j = Math.floor(rnd() * (i + 1));
		[order[i], order[j]] = [order[j], order[i]];
	}
	const grid = new BucketGrid(p, { fine: true });
	const ab = new ActiveBuckets(grid);
	const idx = new Int32Array(n);
	const d2 = new Float64Array(n);
	const bi = new Int32Array(n);
	const bd = new Float64Array(n);
	const active: number[] = [];
	let checked = 0;
	for (let step = 0; step < n; step++) {
		if (step % Math.max(1, Math.floor(n / 40)) === 0 || step < 20) {
			for (let t = 0; t < 5; t++) {
				// Queries at a point (as the engine asks), near one, and outside the box.
				const base = order[Math.floor(rnd() * n)];
				const q = t < 2 ? [p[3 * base], p[3 * base + 1], p[3 * base + 2]] : t < 4 ? [p[3 * base] + rnd() * 0.1, p[3 * base + 1] - rnd() * 0.1, p[3 * base + 2]] : [rnd() * 30 - 15, rnd() * 30 - 15, rnd() * 4 - 2];
				for (const r of radii) {
					for (const k of ks) {
						const m = ab.candidates(q[0], q[1], q[2], k, idx, d2, r);
						const mb = bruteForce(p, active, q, r, bi, bd);
						expect(chosen(idx, d2, m, k), `${name}: step ${step}, r ${r}, k ${k}`).toEqual(chosen(bi, bd, mb, k));
						expect(m).toBeLessThanOrEqual(mb);
						checked++;
					}
				}
			}
		}
		ab.add(order[step]);
		active.push(order[step]);
	}
	expect(checked).toBeGreaterThan(100);
}

describe('ActiveBuckets.candidates', () => {
	it('2D scattered points: the same choice as from every active point within r (random activation order)', () => {
		const rnd = lcg(7);
		const n = 1500;
		const p = new Float64Array(3 * n);
		for (let i = 0; i < n; i++) {
			p[3 * i] = rnd() * 20 - 10;
			p[3 * i + 1] = rnd() * 6 - 3;
		}
		check('2D', p, 11, [0.05, 1, 3], [1, 8, 16, 40]);
	});

	it('3D points on a fine stretched grid with duplicates (ties broken by index)', () => {
		const pts: number[] = [];
		for (let i = 0; i < 12; i++) for (let j = 0; j < 10; j++) for (let k = 0; k < 8; k++) pts.push(i * 0.3, j * 0.25, k * 0.1 * (1 + k * 0.2));
		// Every tenth point twice.
		const base = pts.length / 3;
		for (let i = 0; i < base; i += 10) pts.push(pts[3 * i], pts[3 * i + 1], pts[3 * i + 2]);
		check('3D', Float64Array.from(pts), 5, [0.2, 1], [4, 20]);
	});

	it('clear() makes no point active; no points, no candidates', () => {
		const p = Float64Array.from([0, 0, 0, 1, 0, 0]);
		const ab = new ActiveBuckets(new BucketGrid(p, { fine: true }));
		const idx = new Int32Array(2);
		const d2 = new Float64Array(2);
		ab.add(0);
		ab.add(1);
		expect(ab.candidates(0, 0, 0, 2, idx, d2)).toBe(2);
		ab.clear();
		expect(ab.candidates(0, 0, 0, 2, idx, d2)).toBe(0);
		expect(new ActiveBuckets(new BucketGrid(new Float64Array(0), { fine: true })).candidates(0, 0, 0, 4, idx, d2)).toBe(0);
	});
});
