/**
 * The coarse grids of a multiple-grid path on a lattice: per level ℓ (0 = the lattice itself), the stride in cells
 * along each axis, 3 per level. Along each axis the stride doubles from level to level up to `cap`, the largest power
 * of two not above a quarter of the search ellipsoid's reach along that axis (in cells): the coarsest grid still
 * has about four of its nodes on either side of a target within the search, so a small search reaches as far as
 * the ellipsoid does. Axes with a short reach (the vertical, usually) are not coarsened at all.
 * @throws {RangeError} if a reach is negative or NaN
 */
export function multigridStrides(reach: [number, number, number], counts: [number, number, number]): Int32Array {
	const cap = [1, 1, 1];
	for (let a = 0; a < 3; a++) {
		if (!(reach[a] >= 0)) throw new RangeError('reach must be >= 0');
		// A grid of n cells along an axis needs no stride of n or more (an infinite reach stops there too).
		const limit = Math.min(reach[a] / 4, Math.max(1, counts[a] - 1));
		while (cap[a] * 2 <= limit) cap[a] *= 2;
	}
	let levels = 1;
	while ((1 << (levels - 1)) < Math.max(cap[0], cap[1], cap[2])) levels++;
	const out = new Int32Array(3 * levels);
	for (let l = 0; l < levels; l++) for (let a = 0; a < 3; a++) out[3 * l + a] = Math.min(1 << l, cap[a]);
	return out;
}

/**
 * The level of a lattice cell (i, j, k) under given strides: the coarsest level ℓ whose strides divide all three
 * indices (every cell is on level 0).
 */
export function multigridLevel(strides: Int32Array, i: number, j: number, k: number): number {
	let l = strides.length / 3 - 1;
	while (l > 0 && (i % strides[3 * l] !== 0 || j % strides[3 * l + 1] !== 0 || k % strides[3 * l + 2] !== 0)) l--;
	return l;
}

/**
 * A multiple-grid random path (Deutsch & Journel 1998, ch. V, multiple-grid search (memory); Tran 1994,
 * Computers & Geosciences 20(7–8) (memory)): the nodes of the coarsest grid first, then those of each finer grid
 * that are not on a coarser one, each level in random order (Fisher–Yates, Knuth 1997, TAOCP vol. 2,
 * alg. 3.4.2 P, drawing from `rand` level by level, coarsest first). Long-range structure is then laid down by
 * widely spaced nodes before the fine grid fills in, so a search of a few nodes reproduces long ranges; and on
 * each level a node's previously simulated neighbours sit on regular coarser grids, so neighbourhoods repeat.
 * `level[p]` is the level of nodes[p]. Returns a new array; does not mutate its inputs.
 * @throws {RangeError} if level and nodes differ in length
 */
export function multigridPath(nodes: Int32Array, level: Uint8Array, rand: () => number): Int32Array {
	if (level.length !== nodes.length) throw new RangeError('one level per node');
	let top = 0;
	for (let p = 0; p < level.length; p++) if (level[p] > top) top = level[p];
	const count = new Int32Array(top + 2);
	for (let p = 0; p < level.length; p++) count[top - level[p] + 1]++;
	for (let l = 0; l <= top; l++) count[l + 1] += count[l];
	const start = count.slice();
	const path = new Int32Array(nodes.length);
	// Stable counting sort by level, coarsest first: within a level, nodes keep their (ascending) input order.
	for (let p = 0; p < nodes.length; p++) path[count[top - level[p]]++] = nodes[p];
	for (let l = 0; l <= top; l++) {
		const lo = start[l];
		for (let i = start[l + 1] - 1; i > lo; i--) {
			const j = lo + Math.floor(rand() * (i - lo + 1));
			const t = path[i];
			path[i] = path[j];
			path[j] = t;
		}
	}
	return path;
}
