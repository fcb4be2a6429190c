import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { ensembleMap, labelWeakZones, largestExtentQuantiles, weakZoneFigures, weakZones, type WeakZoneGrid } from '../../src/lib/ensemble/index';
import { expectAbsClose } from '../asserts';

/**
 * An independent labelling for the checks: union–find over the face neighbours (merge each weak cell with its
 * weak −x, −y and −z neighbours, then read the roots), a different algorithm from the module's flood fill.
 * Any correct labelling of face-connected components gives the same partition (Rosenfeld & Pfaltz 1966).
 */
function unionFindLabels(values: ArrayLike<number>, grid: WeakZoneGrid, threshold: number, eligible: Uint8Array): Int32Array {
	const { x: nx, y: ny, z: nz } = grid.counts;
	const n = nx * ny * nz;
	const parent = Int32Array.from({ length: n }, (_, i) => i);
	const find = (a: number): number => {
		while (parent[a] !== a) a = parent[a] = parent[parent[a]];
		return a;
	};
	const weak = (c: number) => eligible[c] === 1 && values[c] < threshold;
	for (let k = 0; k < nz; k++)
		for (let j = 0; j < ny; j++)
			for (let i = 0; i < nx; i++) {
				const c = i + nx * (j + ny * k);
				if (!weak(c)) continue;
				for (const d of [i > 0 ? c - 1 : -1, j > 0 ? c - nx : -1, k > 0 ? c - nx * ny : -1]) {
					if (d >= 0 && weak(d)) parent[find(d)] = find(c);
				}
			}
	const out = new Int32Array(n).fill(-1);
	for (let c = 0; c < n; c++) if (weak(c)) out[c] = find(c);
	return out;
}

/** Whether two labellings make the same partition of the cells (labels may be numbered differently). */
function samePartition(a: Int32Array, b: Int32Array): boolean {
	const ab = new Map<number, number>();
	const ba = new Map<number, number>();
	for (let c = 0; c < a.length; c++) {
		if ((a[c] < 0) !== (b[c] < 0)) return false;
		if (a[c] < 0) continue;
		if ((ab.get(a[c]) ?? b[c]) !== b[c] || (ba.get(b[c]) ?? a[c]) !== a[c]) return false;
		ab.set(a[c], b[c]);
		ba.set(b[c], a[c]);
	}
	return true;
}

/**
 * A section from rows of characters, top row first (highest elevation): '#' weak (value 50), '.' strong (150),
 * 'x' a weak value in a cell that is not eligible (a domain of another property).
 */
function section(rows: string[], dx = 1, dz = 0.5): { values: Float64Array; eligible: Uint8Array; grid: WeakZoneGrid } {
	const nz = rows.length;
	const nx = rows[0].length;
	const values = new Float64Array(nx * nz);
	const eligible = new Uint8Array(nx * nz);
	rows.forEach((row, r) => {
		const k = nz - 1 - r;
		for (let i = 0; i < nx; i++) {
			const c = i + nx * k;
			values[c] = row[i] === '.' ? 150 : 50;
			eligible[c] = row[i] === 'x' ? 0 : 1;
		}
	});
	return { values, eligible, grid: { counts: { x: nx, y: 1, z: nz }, spacing: { x: dx, y: 1, z: dz } } };
}

describe('labelWeakZones(values, grid, threshold, eligible)', () => {
	// A zone touching the grid's left edge and top; a ring around a strong cell; two cells that touch only at a
	// corner (two zones); a weak cell cut off by an ineligible one.
	const crafted = section([
		'##......###.',
		'#......#.#..',
		'#..##..###..',
		'...#.#......',
		'....#..##x#.'
	]);

	it('labelWeakZones gives the partition of an independent union–find labelling on a crafted section (4-neighbour)', () => {
		const z = labelWeakZones(crafted.values, crafted.grid, 100, crafted.eligible);
		expect(samePartition(z.labels, unionFindLabels(crafted.values, crafted.grid, 100, crafted.eligible))).toBe(true);
		// The edge zone (4 cells), the ring (8 cells around a strong one), the 3-cell bar, two singletons touching
		// it only at corners, and the pair and the singleton either side of the ineligible cell.
		expect(z.zones).toBe(7);
	});

	it('labelWeakZones keeps a ring around a strong cell as one zone and the strong cell out of it', () => {
		const z = labelWeakZones(crafted.values, crafted.grid, 100, crafted.eligible);
		const at = (i: number, row: number) => z.labels[i + 12 * (4 - row)];
		const ring = at(7, 1);
		expect(ring).toBeGreaterThanOrEqual(0);
		for (const [i, row] of [[8, 0], [9, 0], [10, 0], [9, 1], [7, 2], [8, 2], [9, 2]]) expect(at(i, row)).toBe(ring);
		expect(at(8, 1)).toBe(-1);
		expect(z.cells[ring]).toBe(8);
		// Columns 7 … 10 at 1 m: 4 m.
		expect(z.extent[ring]).toBe(4);
	});

	it('labelWeakZones counts a zone that touches the grid boundary like any other (no wrap-around to the far side)', () => {
		const z = labelWeakZones(crafted.values, crafted.grid, 100, crafted.eligible);
		const edge = z.labels[0 + 12 * 4];
		expect(z.cells[edge]).toBe(4);
		expect(z.extent[edge]).toBe(2);
		// The far right column holds no weak cell of it.
		for (let k = 0; k < 5; k++) expect(z.labels[11 + 12 * k]).not.toBe(edge);
	});

	it('labelWeakZones puts cells that touch only at a corner in different zones, and an ineligible cell breaks a zone', () => {
		const z = labelWeakZones(crafted.values, crafted.grid, 100, crafted.eligible);
		const at = (i: number, row: number) => z.labels[i + 12 * (4 - row)];
		// (3,3) and (4,4) touch at a corner; (5,3) and (4,4) too.
		expect(at(3, 3)).not.toBe(at(4, 4));
		expect(at(5, 3)).not.toBe(at(4, 4));
		expect(at(3, 3)).toBe(at(3, 2));
		expect(at(9, 4)).toBe(-1);
		expect(at(8, 4)).not.toBe(at(10, 4));
	});

	it('labelWeakZones: weak means strictly below the threshold; NaN is never weak', () => {
		const values = Float64Array.from([100, 99.999, NaN, 99]);
		const z = labelWeakZones(values, { counts: { x: 4, y: 1, z: 1 }, spacing: { x: 2, y: 1, z: 1 } }, 100, new Uint8Array(4).fill(1));
		expect(Array.from(z.labels)).toEqual([-1, 0, -1, 1]);
		expect(Array.from(z.extent)).toEqual([2, 2]);
	});

	it('labelWeakZones joins cells through y in 3D (6-neighbour) but not across an edge', () => {
		// 2 × 2 × 1: cells (0,0) and (0,1) share a y face; (1,0) and (0,1) only an edge.
		const grid: WeakZoneGrid = { counts: { x: 2, y: 2, z: 1 }, spacing: { x: 1, y: 3, z: 1 } };
		const values = Float64Array.from([1, 9, 1, 9]);
		const z = labelWeakZones(values, grid, 5, new Uint8Array(4).fill(1));
		expect(z.zones).toBe(1);
		// One column in x (1), two rows in y (6): the larger.
		expect(z.extent[0]).toBe(6);
		const diag = labelWeakZones(Float64Array.from([9, 1, 1, 9]), grid, 5, new Uint8Array(4).fill(1));
		expect(diag.zones).toBe(2);
	});

	it('labelWeakZones matches union–find on random fields, 2D and 3D (50 fields each)', () => {
		const rng = seedrandom.alea('weak');
		for (const counts of [{ x: 40, y: 1, z: 25 }, { x: 9, y: 8, z: 7 }]) {
			const n = counts.x * counts.y * counts.z;
			const grid = { counts, spacing: { x: 1, y: 1, z: 0.25 } };
			for (let f = 0; f < 50; f++) {
				const values = Float64Array.from({ length: n }, () => rng());
				const eligible = Uint8Array.from({ length: n }, () => (rng() < 0.9 ? 1 : 0));
				const z = labelWeakZones(values, grid, 0.45, eligible);
				const ref = unionFindLabels(values, grid, 0.45, eligible);
				expect(samePartition(z.labels, ref)).toBe(true);
				expect(z.zones).toBe(new Set(Array.from(ref).filter((l) => l >= 0)).size);
			}
		}
	});

	it('labelWeakZones refuses values or eligible of the wrong length and a non-finite threshold; it mutates nothing', () => {
		const { values, eligible, grid } = crafted;
		const before = Float64Array.from(values);
		labelWeakZones(values, grid, 100, eligible);
		expect(values).toEqual(before);
		expect(() => labelWeakZones(values.subarray(1), grid, 100, eligible)).toThrow(RangeError);
		expect(() => labelWeakZones(values, grid, 100, eligible.subarray(1))).toThrow(RangeError);
		expect(() => labelWeakZones(values, grid, NaN, eligible)).toThrow('the threshold must be finite');
	});
});

describe('weakZoneFigures(labels, grid, side)', () => {
	// Boundary between columns 3 and 4: side 0 west of it, 1 east.
	const sideOf = (nx: number, nz: number, at: number) => Int8Array.from({ length: nx * nz }, (_, c) => ((c % nx) >= at ? 1 : 0));

	it('weakZoneFigures: a zone with cells on both sides crosses; zones wholly on one side do not', () => {
		const across = section(['........', '..####..', '........'], 2, 0.25);
		const z = labelWeakZones(across.values, across.grid, 100, across.eligible);
		const f = weakZoneFigures(z, across.grid, sideOf(8, 3, 4));
		expect(f).toEqual({ zones: 1, largestExtent: 8, largestArea: 4 * 2 * 0.25, crossesBoundary: true });
		const apart = section(['........', '.##..##.', '........'], 2, 0.25);
		const g = weakZoneFigures(labelWeakZones(apart.values, apart.grid, 100, apart.eligible), apart.grid, sideOf(8, 3, 4));
		expect(g.crossesBoundary).toBe(false);
		expect(g.zones).toBe(2);
	});

	it('weakZoneFigures: the longest zone and the largest zone may differ; each figure is the greatest of its kind', () => {
		const s = section(['.......###', '######.###', '.......###'], 1, 0.5);
		const f = weakZoneFigures(labelWeakZones(s.values, s.grid, 100, s.eligible), s.grid);
		// The long zone: 6 cells over 6 m; the large one: 9 cells over 3 m.
		expect(f.largestExtent).toBe(6);
		expect(f.largestArea).toBe(9 * 0.5);
		expect(f.crossesBoundary).toBeNull();
		const block = section(['###.', '###.', '....'], 1, 0.5);
		expect(weakZoneFigures(labelWeakZones(block.values, block.grid, 100, block.eligible), block.grid).largestArea).toBe(3);
	});

	it('weakZoneFigures: cells on neither side (−1) do not make a crossing; a grid without weak cells gives zeros', () => {
		const s = section(['.###.'], 1, 1);
		const side = Int8Array.from([0, 0, -1, -1, 1]);
		expect(weakZoneFigures(labelWeakZones(s.values, s.grid, 100, s.eligible), s.grid, side).crossesBoundary).toBe(false);
		const none = section(['.....'], 1, 1);
		expect(weakZoneFigures(labelWeakZones(none.values, none.grid, 100, none.eligible), none.grid, side)).toEqual({
			zones: 0,
			largestExtent: 0,
			largestArea: 0,
			crossesBoundary: false
		});
	});

	it('weakZoneFigures with variable cell heights: the largest area sums its cells’ heights × Δx; labels and extents are those of the regular grid', () => {
		// Rows from the bottom 2, 0.5, 0.25 high: the 2-cell tall zone low down outweighs the 5-cell one near the top.
		const s = section(['.#####.', '.......', '##.....'], 3, 1);
		const heights = [2, 0.5, 0.25];
		const varied: WeakZoneGrid = { ...s.grid, heights };
		const regular = labelWeakZones(s.values, s.grid, 100, s.eligible);
		const z = labelWeakZones(s.values, varied, 100, s.eligible);
		expect(Array.from(z.labels)).toEqual(Array.from(regular.labels));
		expect(Array.from(z.extent)).toEqual(Array.from(regular.extent));
		expect(Array.from(z.heightSum!)).toEqual([2 + 2, 5 * 0.25]);
		expect(regular.heightSum).toBeUndefined();
		expect(weakZoneFigures(z, varied)).toEqual({ zones: 2, largestExtent: 15, largestArea: 4 * 3, crossesBoundary: null });
		expect(weakZoneFigures(regular, s.grid).largestArea).toBe(5 * 3 * 1);
		expect(() => labelWeakZones(s.values, { ...s.grid, heights: [1, 1] }, 100, s.eligible)).toThrow('heights need one entry a row of cells');
	});

	it('weakZoneFigures gives a volume in 3D (cells × Δx × Δy × Δz)', () => {
		const grid: WeakZoneGrid = { counts: { x: 2, y: 2, z: 1 }, spacing: { x: 2, y: 3, z: 0.5 } };
		const z = labelWeakZones(Float64Array.from([1, 1, 1, 9]), grid, 5, new Uint8Array(4).fill(1));
		expect(weakZoneFigures(z, grid).largestArea).toBe(3 * 2 * 3 * 0.5);
	});
});

describe('weakZones(realizations, grid, options)', () => {
	const a = section(['........', '.######.', '........'], 1, 0.5);
	const b = section(['........', '.##..##.', '........'], 1, 0.5);
	const c = section(['#.......', '........', '.......#'], 1, 0.5);

	it('weakZones: per realization the figures of weakZoneFigures; the probability map counts cells in zones at least minLength long', () => {
		const sum = weakZones([a.values, b.values, c.values], a.grid, { threshold: 100, eligible: a.eligible, minLength: 2, side: Int8Array.from({ length: 24 }, (_, k) => ((k % 8) >= 4 ? 1 : 0)) });
		expect(sum.realizations.map((r) => [r.zones, r.largestExtent, r.crossesBoundary])).toEqual([
			[1, 6, true],
			[2, 2, false],
			[2, 1, false]
		]);
		expect(sum.crossingProbability).toBeCloseTo(1 / 3, 15);
		// Cell (1, middle row): weak and in a zone ≥ 2 long in a and b; in c it is not weak.
		expectAbsClose(sum.probabilityMap[1 + 8], 2 / 3, 1e-15);
		// Cell (0, top row): weak only in c, in a zone 1 long: not counted at minLength 2.
		expect(sum.probabilityMap[0 + 8 * 2]).toBe(0);
		const any = weakZones([a.values, b.values, c.values], a.grid, { threshold: 100, eligible: a.eligible });
		expectAbsClose(any.probabilityMap[0 + 8 * 2], 1 / 3, 1e-15);
		expect(any.crossingProbability).toBeNull();
		expect(any.realizations.every((r) => r.crossesBoundary === null)).toBe(true);
	});

	it('weakZones: P10/P50/P90 of the largest extent are the ensemble maps’ quantiles of the per-realization extents (exact)', () => {
		const rng = seedrandom.alea('extents');
		const grid: WeakZoneGrid = { counts: { x: 30, y: 1, z: 6 }, spacing: { x: 1.5, y: 1, z: 0.2 } };
		const eligible = new Uint8Array(180).fill(1);
		const rs = Array.from({ length: 13 }, () => Float64Array.from({ length: 180 }, () => rng()));
		const sum = weakZones(rs, grid, { threshold: 0.5, eligible });
		const extents = sum.realizations.map((r) => Float64Array.of(r.largestExtent));
		for (const p of ['p10', 'p50', 'p90'] as const) expect(sum.largestExtent[p]).toBe(ensembleMap(extents, p)[0]);
		expect(largestExtentQuantiles(sum.realizations)).toEqual(sum.largestExtent);
		expect(() => largestExtentQuantiles([])).toThrow('no realizations');
	});

	it('weakZones: the map is NaN where a cell is not eligible', () => {
		const sum = weakZones([crafted().values], crafted().grid, { threshold: 100, eligible: crafted().eligible });
		const nan = Array.from(sum.probabilityMap).flatMap((v, k) => (Number.isNaN(v) ? [k] : []));
		expect(nan).toEqual([9 + 12]);
	});

	it('weakZones refuses no realizations and a negative or infinite minLength', () => {
		expect(() => weakZones([], a.grid, { threshold: 100, eligible: a.eligible })).toThrow('no realizations');
		expect(() => weakZones([a.values], a.grid, { threshold: 100, eligible: a.eligible, minLength: -1 })).toThrow(RangeError);
		expect(() => weakZones([a.values], a.grid, { threshold: 100, eligible: a.eligible, minLength: Infinity })).toThrow(RangeError);
	});
});

function crafted() {
	return section(['.........x..', '............']);
}
