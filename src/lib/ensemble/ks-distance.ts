/**
 * The Kolmogorov–Smirnov distance between the empirical CDF of `values` (equal weights) and the weighted
 * empirical CDF of `reference` (e.g. declustered data): sup over x of |F(x) − G(x)|, with both CDFs as steps
 * that jump at each value by its weight (Kolmogorov 1933; Smirnov 1948; e.g. Conover 1999, ch. 6). 0 for
 * identical distributions, 1 for disjoint ones. NaN values are skipped. Does not mutate its inputs.
 * @throws {RangeError} if either side has no finite value, the weights differ in length from the reference,
 *   or a weight is negative or they sum to 0
 */
export function ksDistance(values: ArrayLike<number>, reference: ArrayLike<number>, weights?: ArrayLike<number>): number {
	const a: number[] = [];
	for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) a.push(values[i]);
	if (a.length === 0) throw new RangeError('no finite values');
	if (weights && weights.length !== reference.length) throw new RangeError('weights must match the reference');
	const b: { v: number; w: number }[] = [];
	let wsum = 0;
	for (let i = 0; i < reference.length; i++) {
		const w = weights ? weights[i] : 1;
		if (!(w >= 0)) throw new RangeError('weights must be >= 0');
		if (!Number.isFinite(reference[i])) continue;
		b.push({ v: reference[i], w });
		wsum += w;
	}
	if (b.length === 0 || !(wsum > 0)) throw new RangeError('no finite reference values with weight');
	a.sort((p, q) => p - q);
	b.sort((p, q) => p.v - q.v);
	let i = 0;
	let j = 0;
	let fa = 0;
	let fb = 0;
	let d = 0;
	while (i < a.length || j < b.length) {
		const x = Math.min(i < a.length ? a[i] : Infinity, j < b.length ? b[j].v : Infinity);
		while (i < a.length && a[i] === x) {
			i++;
			fa = i / a.length;
		}
		while (j < b.length && b[j].v === x) {
			fb += b[j].w / wsum;
			j++;
		}
		d = Math.max(d, Math.abs(fa - fb));
	}
	return d;
}
