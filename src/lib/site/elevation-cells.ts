import { domainReader, type GridStratigraphy } from './grid-domains';

/** An elevation band and the cell height wanted in it. */
export interface HeightBand {
	bottom: number;
	top: number;
	cell: number;
}

/** Cell edges and centres along the elevation axis, ascending. */
export interface ElevationCells {
	/** counts.z + 1 edges, from `from` to `to`. */
	edges: number[];
	/** The cell centres, (edges[k] + edges[k + 1]) / 2. */
	centres: number[];
}

/**
 * The cells of an elevation axis from `from` to `to` whose heights follow bands: at each elevation the wanted
 * height is the smallest `cell` of the bands that cover it, or `cell` where none does. The axis is cut at every
 * band edge inside it; adjacent pieces that want the same height are joined; each piece then holds
 * n = max(1, round(length / wanted)) equal cells, so cells end exactly at the band edges and are within a factor
 * of about 1.5 of the wanted height (exactly it where the piece is a whole number of cells). Not mutating.
 * @throws {RangeError} for `to` not above `from`, a height that is not > 0, or a band whose top is not above its bottom
 */
export function elevationCells(from: number, to: number, cell: number, bands: readonly HeightBand[] = []): ElevationCells {
	if (!(to > from) || !Number.isFinite(from) || !Number.isFinite(to)) throw new RangeError('each axis must run from a lower to a higher value');
	if (!(cell > 0) || !Number.isFinite(cell)) throw new RangeError('cell sizes must be > 0');
	for (const b of bands) {
		if (!(b.cell > 0) || !Number.isFinite(b.cell)) throw new RangeError('cell sizes must be > 0');
		if (!(b.top > b.bottom)) throw new RangeError('a band must run from a lower to a higher elevation');
	}
	const cuts = [from, to];
	for (const b of bands) for (const e of [b.bottom, b.top]) if (e > from && e < to) cuts.push(e);
	cuts.sort((a, b) => a - b);
	const breaks = cuts.filter((c, i) => i === 0 || c > cuts[i - 1]);
	const pieces: { bottom: number; top: number; cell: number }[] = [];
	for (let i = 0; i + 1 < breaks.length; i++) {
		const mid = (breaks[i] + breaks[i + 1]) / 2;
		let wanted = Infinity;
		for (const b of bands) if (b.bottom <= mid && mid <= b.top && b.cell < wanted) wanted = b.cell;
		if (wanted === Infinity) wanted = cell;
		const last = pieces[pieces.length - 1];
		if (last && last.cell === wanted) last.top = breaks[i + 1];
		else pieces.push({ bottom: breaks[i], top: breaks[i + 1], cell: wanted });
	}
	const edges: number[] = [from];
	for (const p of pieces) {
		const length = p.top - p.bottom;
		const n = Math.max(1, Math.round(length / p.cell));
		for (let m = 1; m < n; m++) edges.push(p.bottom + (length * m) / n);
		edges.push(p.top);
	}
	const centres = edges.slice(1).map((e, k) => (edges[k] + e) / 2);
	return { edges, centres };
}

/**
 * The elevation bands of units given a cell height each (e.g. 0.25 m in a liquefiable unit, 1 m in the dense
 * deposits below): a unit's band runs from the lowest to the highest elevation it occupies in any of the grid's
 * columns (the stratigraphy read at each column centre as domainReader reads it: a unit lies from its top, or the
 * ground where that is lower, down to the next lower top; the lowest present unit down to `from`). Units absent
 * from every column give no band. A unit's cells are thus never coarser than asked anywhere along the grid, at the
 * price of finer cells where units overlap in elevation. Not mutating.
 */
export function unitHeightBands(
	strat: GridStratigraphy,
	geometry: '2d' | '3d',
	columns: readonly { x: number; y: number }[],
	heights: readonly { unitId: string; cell: number }[],
	from: number
): HeightBand[] {
	const reader = domainReader(strat, [], geometry);
	const nu = strat.units.length;
	const lo = new Float64Array(nu).fill(Infinity);
	const hi = new Float64Array(nu).fill(-Infinity);
	for (const c of columns) {
		const column = reader.column(c.x, c.y);
		if (!column) continue;
		const { tops, ground } = column;
		for (let k = 0; k < nu; k++) {
			const top = tops[k];
			if (!Number.isFinite(top)) continue;
			// The next lower top (equal tops: the later unit in the stack lies below, as domainAt takes them).
			let below = -Infinity;
			for (let m = 0; m < nu; m++) {
				if (m === k || !Number.isFinite(tops[m])) continue;
				if ((tops[m] < top || (tops[m] === top && m > k)) && tops[m] > below) below = tops[m];
			}
			const upper = Math.min(top, ground);
			const lower = below === -Infinity ? from : below;
			if (!(upper > lower)) continue;
			if (lower < lo[k]) lo[k] = lower;
			if (upper > hi[k]) hi[k] = upper;
		}
	}
	const bands: HeightBand[] = [];
	for (const h of heights) {
		const k = strat.units.findIndex((u) => u.id === h.unitId);
		if (k < 0 || !(hi[k] > lo[k])) continue;
		bands.push({ bottom: lo[k], top: hi[k], cell: h.cell });
	}
	return bands;
}
