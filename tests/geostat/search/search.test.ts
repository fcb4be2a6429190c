import { describe, it, expect } from 'vitest';
import { BucketGrid, selectNearest, offsetTemplate, searchEllipsoid, normalisedCoordinates } from '../../../src/lib/geostat/index';
import type { VariogramModel } from '../../../src/lib/geostat/index';

function lcg(seed: number) {
	let s = seed;
	return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

const model: VariogramModel = {
	azimuth: 30,
	structures: [
		{ type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
		{ type: 'exponential', sill: 0.5, rangeMajor: 20, rangeMinor: 8, rangeVertical: 2 },
		{ type: 'spherical', sill: 0.4, rangeMajor: 10, rangeMinor: 12, rangeVertical: 1 }
	]
};

describe('searchEllipsoid(model, radius)', () => {
	it('searchEllipsoid(model) takes the largest range per axis of the non-nugget structures (common practice)', () => {
		const e = searchEllipsoid(model);
		expect([e.major, e.minor, e.vertical, e.empty]).toEqual([20, 12, 2, false]);
		const r = searchEllipsoid(model, { major: 5, minor: 4, vertical: 3 });
		expect([r.major, r.minor, r.vertical]).toEqual([5, 4, 3]);
		expect(searchEllipsoid({ azimuth: 0, structures: [{ type: 'nugget', sill: 1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 }] }).empty).toBe(true);
		expect(() => searchEllipsoid(model, { major: 0, minor: 1, vertical: 1 })).toThrow(RangeError);
	});

	it('normalisedCoordinates puts the ellipsoid tips on the unit sphere (within 1e-12)', () => {
		const e = searchEllipsoid(model);
		const out = new Float64Array(3);
		// Major axis direction at azimuth 30° clockwise from +y: (sin 30°, cos 30°).
		normalisedCoordinates(e, 20 * 0.5, 20 * Math.sqrt(3) / 2, 0, out);
		expect(Math.abs(Math.hypot(out[0], out[1], out[2]) - 1)).toBeLessThan(1e-12);
		normalisedCoordinates(e, 0, 0, -2, out);
		expect(Math.abs(Math.hypot(out[0], out[1], out[2]) - 1)).toBeLessThan(1e-12);
	});
});

describe('BucketGrid', () => {
	it('BucketGrid.query(q) returns exactly the points within distance r, as brute force does', () => {
		const rnd = lcg(3);
		const n = 2000;
		const p = Float64Array.from({ length: 3 * n }, () => rnd() * 10 - 5);
		const grid = new BucketGrid(p);
		const idx = new Int32Array(n);
		const d2 = new Float64Array(n);
		for (let t = 0; t < 50; t++) {
			const q = [rnd() * 12 - 6, rnd() * 12 - 6, rnd() * 12 - 6];
			const r = 0.3 + rnd() * 2;
			const m = grid.query(q[0], q[1], q[2], idx, d2, r);
			const got = Array.from(idx.subarray(0, m)).sort((a, b) => a - b);
			const want: number[] = [];
			for (let i = 0; i < n; i++) {
				const dd = (p[3 * i] - q[0]) ** 2 + (p[3 * i + 1] - q[1]) ** 2 + (p[3 * i + 2] - q[2]) ** 2;
				if (dd <= r * r) want.push(i);
			}
			expect(got).toEqual(want);
		}
	});

	it('BucketGrid handles no points, one point, duplicates, and rejects NaN', () => {
		const idx = new Int32Array(4);
		const d2 = new Float64Array(4);
		expect(new BucketGrid(new Float64Array(0)).query(0, 0, 0, idx, d2)).toBe(0);
		expect(new BucketGrid(new Float64Array([1, 1, 1])).query(1, 1, 1.5, idx, d2)).toBe(1);
		expect(new BucketGrid(new Float64Array([1, 1, 1, 1, 1, 1])).query(1, 1, 1, idx, d2)).toBe(2);
		expect(() => new BucketGrid(new Float64Array([NaN, 0, 0]))).toThrow(RangeError);
		expect(() => new BucketGrid(new Float64Array(2))).toThrow(RangeError);
	});
});

describe('selectNearest', () => {
	it('selectNearest(k, maxPerGroup) equals sorting by (distance, index) and taking greedily under the group cap', () => {
		const rnd = lcg(11);
		for (let t = 0; t < 300; t++) {
			const n = 1 + Math.floor(rnd() * 60);
			const idx = Int32Array.from({ length: n }, (_, i) => (i * 7919) % 1000);
			// Rounded distances make ties, which the index breaks.
			const d2 = Float64Array.from({ length: n }, () => Math.round(rnd() * 20) / 4);
			const group = Int32Array.from({ length: 1000 }, (_, i) => (i % 5 === 0 ? -1 : i % 4));
			const k = 1 + Math.floor(rnd() * 12);
			const cap = 1 + Math.floor(rnd() * 4);
			const outIdx = new Int32Array(k);
			const outD2 = new Float64Array(k);
			const m = selectNearest(idx, d2, n, k, outIdx, outD2, group, cap);
			const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => d2[a] - d2[b] || idx[a] - idx[b]);
			const want: number[] = [];
			const used = new Map<number, number>();
			for (const c of order) {
				if (want.length === k) break;
				const g = group[idx[c]];
				if (g >= 0 && (used.get(g) ?? 0) >= cap) continue;
				if (g >= 0) used.set(g, (used.get(g) ?? 0) + 1);
				want.push(idx[c]);
			}
			expect(Array.from(outIdx.subarray(0, m))).toEqual(want);
		}
	});

	it('selectNearest handles large group numbers and leaves no count behind between calls', () => {
		const idx = Int32Array.from([0, 1, 2, 3, 4, 5]);
		const d2 = Float64Array.from([0.1, 0.2, 0.3, 0.4, 0.5, 0.6]);
		const group = Int32Array.from([70_000, 70_000, 70_000, 9, 9, -1]);
		const o = new Int32Array(4);
		const d = new Float64Array(4);
		expect(Array.from(o.subarray(0, selectNearest(idx, d2, 6, 4, o, d, group, 2)))).toEqual([0, 1, 3, 4]);
		// The same call again: counts from the first call must not carry over.
		expect(Array.from(o.subarray(0, selectNearest(idx, d2, 6, 4, o, d, group, 2)))).toEqual([0, 1, 3, 4]);
		expect(Array.from(o.subarray(0, selectNearest(idx, d2, 6, 4, o, d, group, 1)))).toEqual([0, 3, 5]);
	});

	it('selectNearest with k = 0 or no candidates selects nothing', () => {
		const o = new Int32Array(2);
		const d = new Float64Array(2);
		expect(selectNearest(new Int32Array([1]), new Float64Array([0]), 1, 0, o, d)).toBe(0);
		expect(selectNearest(new Int32Array(0), new Float64Array(0), 0, 2, o, d)).toBe(0);
	});
});

describe('offsetTemplate', () => {
	it('offsetTemplate(e, spacing) lists every grid offset inside the ellipsoid once, nearest first', () => {
		const e = searchEllipsoid({ azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 6, rangeMinor: 3, rangeVertical: 1 }] });
		const t = offsetTemplate(e, [1, 1, 0.5], [100, 100, 100]);
		let inside = 0;
		for (let i = -6; i <= 6; i++) for (let j = -6; j <= 6; j++) for (let k = -2; k <= 2; k++) {
			if ((i || j || k) && (i / 6) ** 2 + (j / 3) ** 2 + (k * 0.5) ** 2 <= 1 + 1e-12) inside++;
		}
		expect(t.count).toBe(inside);
		for (let s = 1; s < t.count; s++) expect(t.d2[s]).toBeGreaterThanOrEqual(t.d2[s - 1]);
		const keys = new Set<string>();
		for (let s = 0; s < t.count; s++) keys.add(`${t.offsets[3 * s]},${t.offsets[3 * s + 1]},${t.offsets[3 * s + 2]}`);
		expect(keys.size).toBe(t.count);
	});

	it('offsetTemplate respects the per-axis limit and an infinite minor axis (a section)', () => {
		const e = searchEllipsoid({ azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: Infinity, rangeVertical: 1 }] });
		const t = offsetTemplate(e, [1, 1, 0.25], [399, 0, 29]);
		expect(t.extent).toEqual([40, 0, 4]);
		for (let s = 0; s < t.count; s++) expect(t.offsets[3 * s + 1]).toBe(0);
		expect(() => offsetTemplate(e, [0, 1, 1], [1, 1, 1])).toThrow(RangeError);
	});
});
