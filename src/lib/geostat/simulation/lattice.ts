import type { TargetPoints } from './types';

/** A regular lattice holding the simulated targets: origin, spacing and counts per axis, and cell → target. */
export interface Lattice {
	origin: [number, number, number];
	spacing: [number, number, number];
	counts: [number, number, number];
	/** Target index of each cell (x fastest, then y, then z), −1 where there is none. */
	cell: Int32Array;
	/** Cell of each target, −1 for targets outside any domain. */
	cellOf: Int32Array;
}

// Relative tolerance of "on the lattice": coordinates generated as origin + i·spacing round to well within it.
const ON_LATTICE = 1e-9;

/**
 * Recognises targets (those with domain ≥ 0) that sit on a regular lattice, each in its own cell and filling
 * at least a quarter of the lattice's box; returns null otherwise. Regular grids repeat offsets, so the
 * simulation can walk an offset template and look covariances up in a table.
 */
export function detectLattice(t: TargetPoints, maxCells = 64_000_000): Lattice | null {
	const n = t.domain.length;
	let active = 0;
	for (let i = 0; i < n; i++) if (t.domain[i] >= 0) active++;
	if (active === 0) return null;
	const cols = [t.x, t.y, t.z];
	const origin: [number, number, number] = [0, 0, 0];
	const spacing: [number, number, number] = [1, 1, 1];
	const counts: [number, number, number] = [1, 1, 1];
	for (let a = 0; a < 3; a++) {
		const vals = new Float64Array(active);
		let m = 0;
		for (let i = 0; i < n; i++) if (t.domain[i] >= 0) vals[m++] = cols[a][i];
		vals.sort();
		let gap = Infinity;
		for (let i = 1; i < m; i++) {
			const d = vals[i] - vals[i - 1];
			if (d > 0 && d < gap) gap = d;
		}
		origin[a] = vals[0];
		if (gap === Infinity) continue;
		const span = vals[m - 1] - vals[0];
		const c = Math.round(span / gap) + 1;
		if (c > maxCells) return null;
		// Refine the spacing from the whole span: the smallest gap carries the most rounding.
		const s = span / (c - 1);
		for (let i = 0; i < m; i++) {
			const f = (vals[i] - vals[0]) / s;
			if (Math.abs(f - Math.round(f)) > ON_LATTICE * Math.max(1, f)) return null;
		}
		spacing[a] = s;
		counts[a] = c;
	}
	const total = counts[0] * counts[1] * counts[2];
	if (total > maxCells || total > 4 * active + 1024) return null;
	const cell = new Int32Array(total).fill(-1);
	const cellOf = new Int32Array(n).fill(-1);
	for (let i = 0; i < n; i++) {
		if (t.domain[i] < 0) continue;
		const ix = Math.round((t.x[i] - origin[0]) / spacing[0]);
		const iy = Math.round((t.y[i] - origin[1]) / spacing[1]);
		const iz = Math.round((t.z[i] - origin[2]) / spacing[2]);
		const c = (iz * counts[1] + iy) * counts[0] + ix;
		if (cell[c] >= 0) return null;
		cell[c] = i;
		cellOf[i] = c;
	}
	return { origin, spacing, counts, cell, cellOf };
}
