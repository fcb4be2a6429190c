import type { SearchEllipsoid } from './search-ellipsoid';

/** Grid offsets inside a search ellipsoid, nearest first. */
export interface OffsetTemplate {
	/** Offsets in cells, 3 per entry (i, j, k along x, y, z). */
	offsets: Int32Array;
	/** Squared normalised distance of each offset (≤ 1). */
	d2: Float64Array;
	count: number;
	/** Half-extents of the enumerated box in cells. */
	extent: [number, number, number];
	/** Half-extents of the ellipsoid's bounding box in cells, before the limit (Infinity for an infinite axis). */
	reach: [number, number, number];
}

/**
 * The offsets (in cells) of a regular grid that fall inside a search ellipsoid, the origin excluded, sorted
 * by normalised distance with the offset's lexicographic order as tie-break. On a regular grid the nearest
 * previously simulated nodes are then found by walking this list — the usual spiral search of sequential
 * simulation on grids (Deutsch & Journel 1998, ch. V; common practice). `limit` caps the half-extent per axis
 * (a grid of n cells needs no offset beyond n − 1).
 * @throws {RangeError} on a non-positive spacing, or when the ellipsoid holds more than `maxEntries` cells
 */
export function offsetTemplate(
	e: SearchEllipsoid,
	spacing: [number, number, number],
	limit: [number, number, number],
	maxEntries = 4_000_000
): OffsetTemplate {
	if (!spacing.every((s) => s > 0 && Number.isFinite(s))) throw new RangeError('spacing must be > 0');
	const half = [0, 0, 0] as [number, number, number];
	const reach = [0, 0, 0] as [number, number, number];
	if (!e.empty) {
		const a = e.major;
		const b = e.minor;
		// Plan half-extents of an ellipse with semi-axes a along (sin, cos) and b along (cos, −sin).
		const ex = Math.sqrt(sq(prod(a, e.sin)) + sq(prod(b, e.cos)));
		const ey = Math.sqrt(sq(prod(a, e.cos)) + sq(prod(b, e.sin)));
		const ext = [ex, ey, e.vertical];
		for (let ax = 0; ax < 3; ax++) {
			reach[ax] = Math.floor(ext[ax] / spacing[ax]);
			half[ax] = Math.min(limit[ax], reach[ax]);
		}
	}
	const box = (2 * half[0] + 1) * (2 * half[1] + 1) * (2 * half[2] + 1);
	if (box > 20 * maxEntries) throw new RangeError('search ellipsoid too large for a grid template');
	const tmp: number[] = [];
	const dist: number[] = [];
	for (let i = -half[0]; i <= half[0]; i++) {
		const x = i * spacing[0];
		for (let j = -half[1]; j <= half[1]; j++) {
			const y = j * spacing[1];
			const u = e.major === Infinity ? 0 : (x * e.sin + y * e.cos) / e.major;
			const v = e.minor === Infinity ? 0 : (x * e.cos - y * e.sin) / e.minor;
			const uv = u * u + v * v;
			if (uv > 1) continue;
			for (let k = -half[2]; k <= half[2]; k++) {
				if (i === 0 && j === 0 && k === 0) continue;
				const w = e.vertical === Infinity ? 0 : (k * spacing[2]) / e.vertical;
				const dd = uv + w * w;
				if (dd > 1) continue;
				tmp.push(i, j, k);
				dist.push(dd);
				if (dist.length > maxEntries) throw new RangeError('search ellipsoid too large for a grid template');
			}
		}
	}
	const n = dist.length;
	const order = Array.from({ length: n }, (_, t) => t);
	// Enumeration order is lexicographic, so the entry index is the lexicographic tie-break.
	order.sort((p, q) => dist[p] - dist[q] || p - q);
	const offsets = new Int32Array(3 * n);
	const d2 = new Float64Array(n);
	for (let t = 0; t < n; t++) {
		const o = order[t];
		offsets[3 * t] = tmp[3 * o];
		offsets[3 * t + 1] = tmp[3 * o + 1];
		offsets[3 * t + 2] = tmp[3 * o + 2];
		d2[t] = dist[o];
	}
	return { offsets, d2, count: n, extent: half, reach };
}

// An infinite semi-axis perpendicular to an axis adds nothing to that axis' extent; cos 90° evaluates to
// about 6e-17, not 0, and Infinity · 0 would be NaN, hence the threshold.
function prod(a: number, s: number): number {
	return Math.abs(s) < 1e-12 ? 0 : a * s;
}

function sq(v: number): number {
	return v * v;
}
