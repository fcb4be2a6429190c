import { quantileSorted } from 'd3';

export interface RobustRangeOptions {
	scale?: 'linear' | 'log';
	/** The span the quantity can plausibly take (the property catalogue's range, in the plot's units). */
	plausible?: { min: number; max: number };
	/** A linear axis that should start at zero when every value is positive (cone resistance, friction). */
	fromZero?: boolean;
}

/** The axis range to draw, and how many values lie beyond it at each end. */
export interface RobustRange {
	domain: [number, number];
	below: number;
	above: number;
}

/** Margin beyond the 1st and 99th percentiles, as a share of the span between them, before values count as outliers. */
const MARGIN = 0.25;

/**
 * An axis range that a few wild values cannot flatten: the values' own range where they have no outliers, else
 * the 1st–99th percentile span (d3 quantileSorted, linear interpolation between order statistics) widened by a
 * quarter of itself at each end, and never wider than the plausible range. On a log axis the same is done on
 * log10 of the positive values. Values beyond are counted so the plot can mark them; nothing is dropped.
 * Null, NaN and infinite values (and non-positive ones on a log axis) are left out. Not mutating.
 */
export function robustRange(values: ArrayLike<number | null>, { scale = 'linear', plausible, fromZero = false }: RobustRangeOptions = {}): RobustRange {
	const log = scale === 'log';
	const t = (v: number) => (log ? Math.log10(v) : v);
	const back = (v: number) => (log ? 10 ** v : v);
	const kept: number[] = [];
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (v !== null && Number.isFinite(v) && (!log || v > 0)) kept.push(t(v));
	}
	if (kept.length === 0) return { domain: log ? [1, 10] : [0, 1], below: 0, above: 0 };
	kept.sort((a, b) => a - b);
	const q1 = quantileSorted(kept, 0.01)!;
	const q99 = quantileSorted(kept, 0.99)!;
	const margin = MARGIN * (q99 - q1);
	let lo = Math.max(kept[0], q1 - margin);
	let hi = Math.min(kept[kept.length - 1], q99 + margin);
	if (plausible) {
		if (!log || plausible.min > 0) lo = Math.max(lo, t(plausible.min));
		if (!log || plausible.max > 0) hi = Math.min(hi, t(plausible.max));
	}
	if (!log && fromZero) lo = Math.min(0, lo);
	if (!(hi > lo)) [lo, hi] = log ? [lo - 0.5, lo + 0.5] : [lo - 0.5, lo + 0.5];
	let below = 0;
	let above = 0;
	for (const v of kept) {
		if (v < lo) below++;
		else if (v > hi) above++;
	}
	return { domain: [back(lo), back(hi)], below, above };
}
