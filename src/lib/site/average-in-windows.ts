/**
 * Averages readings of one sounding in windows of height h fixed in elevation (window k spans
 * [k·h, (k+1)·h)), so windows line up between soundings and with a simulation grid of that cell height.
 * Each window with readings gives one sample: the mean or median of its values at the mean elevation of its
 * readings (a window the domain fills only in part is not credited with its centre). Output runs top down.
 * Not mutating.
 * @throws {RangeError} on h not > 0, unequal lengths, or an averaging other than mean or median
 */
export function averageInWindows(
	elevation: ArrayLike<number>,
	value: ArrayLike<number>,
	h: number,
	averaging: 'mean' | 'median'
): { z: number[]; value: number[]; count: number[] } {
	if (!(h > 0) || !Number.isFinite(h)) throw new RangeError('cell height must be > 0');
	if (elevation.length !== value.length) throw new RangeError('elevation and value lengths differ');
	if (averaging !== 'mean' && averaging !== 'median') throw new RangeError('averaging must be mean or median');
	const windows = new Map<number, { z: number[]; v: number[] }>();
	for (let i = 0; i < elevation.length; i++) {
		// The small shift keeps a reading that sits on a window edge in the upper window despite rounding (0.3/0.1 = 2.9999…).
		const k = Math.floor(elevation[i] / h + 1e-9);
		let w = windows.get(k);
		if (!w) windows.set(k, (w = { z: [], v: [] }));
		w.z.push(elevation[i]);
		w.v.push(value[i]);
	}
	const out = { z: [] as number[], value: [] as number[], count: [] as number[] };
	for (const k of [...windows.keys()].sort((a, b) => b - a)) {
		const w = windows.get(k)!;
		out.z.push(mean(w.z));
		out.value.push(averaging === 'mean' ? mean(w.v) : median(w.v));
		out.count.push(w.v.length);
	}
	return out;
}

function mean(a: number[]): number {
	let s = 0;
	for (const v of a) s += v;
	return s / a.length;
}

function median(a: number[]): number {
	const s = [...a].sort((p, q) => p - q);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
