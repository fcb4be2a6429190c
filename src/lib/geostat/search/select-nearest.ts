/**
 * Picks the k nearest candidates in the order (squared distance, index), taking at most `maxPerGroup`
 * from any one group (a sounding), exactly as if all candidates were sorted and taken greedily
 * (the usual octant/sounding limits of a kriging search; Deutsch & Journel 1998, ch. II). Groups < 0 are
 * never limited. Writes the chosen indices, nearest first, to outIdx (and distances to outD2) and returns
 * how many. One pass with a sorted insertion buffer of length k: cost O(n·k) at worst, O(n) typically.
 * Does not mutate idx or d2.
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
		if (limited) {
			const g = group![id];
			if (g >= 0) {
				// Count the group's members nearer than the candidate and find its farthest member.
				let count = 0;
				let last = -1;
				for (let t = 0; t < m; t++) {
					if (group![outIdx[t]] === g) {
						count++;
						last = t;
					}
				}
				if (count >= maxPerGroup) {
					const ld = outD2[last];
					const li = outIdx[last];
					// The candidate displaces the group's farthest member only if it is nearer.
					if (dd > ld || (dd === ld && id > li)) continue;
					for (let t = last; t < m - 1; t++) {
						outIdx[t] = outIdx[t + 1];
						outD2[t] = outD2[t + 1];
					}
					m--;
				}
			}
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
	}
	return m;
}
