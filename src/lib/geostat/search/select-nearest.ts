/**
 * Picks the k nearest candidates in the order (squared distance, index), taking at most `maxPerGroup`
 * from any one group (a sounding), exactly as if all candidates were sorted and taken greedily
 * (the usual octant/sounding limits of a kriging search; Deutsch & Journel 1998, ch. II). Groups < 0 are
 * never limited. Writes the chosen indices, nearest first, to outIdx (and distances to outD2) and returns how
 * many. One pass with a sorted insertion buffer of length k and a count per group: cost O(n·k) at worst, O(n)
 * typically. Does not mutate idx or d2.
 */
export function selectNearest(
	idx: Int32Array,
	d2: Float64Array,
	n: number,
	k: number,
	outIdx: Int32Array,
	outD2: Float64Array,
	group: Int32Array | null = null,
	maxPerGroup = Infinity
): number {
	if (k <= 0) return 0;
	const limited = group !== null && maxPerGroup < k;
	let m = 0;
	for (let c = 0; c < n; c++) {
		const id = idx[c];
		const dd = d2[c];
		if (m === k && (dd > outD2[m - 1] || (dd === outD2[m - 1] && id > outIdx[m - 1]))) continue;
		const g = limited ? group![id] : -1;
		// How many of the chosen so far each group has: kept up to date instead of counted per candidate.
		if (g >= counts.length) grow(g);
		const count = counts;
		if (g >= 0 && count[g] >= maxPerGroup) {
			// The group is full: the candidate displaces the group's farthest member (the last of it) only if nearer.
			let last = m - 1;
			while (group![outIdx[last]] !== g) last--;
			const ld = outD2[last];
			if (dd > ld || (dd === ld && id > outIdx[last])) continue;
			for (let t = last; t < m - 1; t++) {
				outIdx[t] = outIdx[t + 1];
				outD2[t] = outD2[t + 1];
			}
			m--;
			count[g]--;
		}
		if (m === k && limited) {
			// The farthest chosen one falls off the end.
			const gl = group![outIdx[k - 1]];
			if (gl >= 0) count[gl]--;
		}
		let t = m < k ? m : k - 1;
		while (t > 0 && (outD2[t - 1] > dd || (outD2[t - 1] === dd && outIdx[t - 1] > id))) {
			outIdx[t] = outIdx[t - 1];
			outD2[t] = outD2[t - 1];
			t--;
		}
		outIdx[t] = id;
		outD2[t] = dd;
		if (m < k) m++;
		if (g >= 0) count[g]++;
	}
	if (limited) for (let t = 0; t < m; t++) if (group![outIdx[t]] >= 0) counts[group![outIdx[t]]] = 0;
	return m;
}

// Scratch counts by group, zero between calls; grown to the largest group seen.
let counts = new Int32Array(64);

function grow(g: number): void {
	const next = new Int32Array(2 * g + 2);
	next.set(counts);
	counts = next;
}
