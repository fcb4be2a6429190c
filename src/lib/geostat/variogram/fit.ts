import ln from '@stdlib/math-base-special-ln';
import exp from '@stdlib/math-base-special-exp';
import type { FitInput, FitOptions, LagBin, Structure, VariogramModel } from '../types';
import { compileVariogram, planRotation, unitGamma } from './model';

/** Directions of fitted bins: vertical, horizontal along the major axis, horizontal across it. */
const VERTICAL = 0;
const MAJOR = 1;
const MINOR = 2;

/** Bins actually used in a fit: separations, experimental values, Cressie weights, directions. */
interface Design {
	h: Float64Array;
	g: Float64Array;
	w: Float64Array;
	/** VERTICAL, MAJOR or MINOR. */
	dir: Uint8Array;
	/** The largest γ̂; g holds γ̂ / scale, so huge or tiny variances neither overflow nor underflow in the weights. */
	scale: number;
}

const TYPES = ['spherical', 'exponential', 'gaussian'] as const;

/**
 * Fits one variogram structure plus an optional nugget to vertical and/or horizontal experimental bins by
 * weighted least squares with Cressie's weights N(h)/γ̂(h)² (Cressie 1985, Mathematical Geology 17(5); the
 * weights use the experimental γ̂, fixed during the fit, a common simplification of Cressie's criterion).
 * The sill is shared by all directions; rangeVertical comes from the vertical bins, rangeMajor from the
 * horizontal bins (along `azimuth`, the model's major axis) and rangeMinor from the `horizontalMinor` bins
 * (across it) — without those, rangeMinor = rangeMajor (isotropic in plan: what a 2D section needs). A
 * direction without usable bins takes another's range (minor ← major, major ← minor, then either ← vertical,
 * vertical ← major). Bins with fewer than minPairs (default 30) pairs, a non-finite γ̂ or h ≤ 0 are left out;
 * a γ̂ of 0 is floored at 1e-6 of the largest γ̂ so its weight stays finite.
 *
 * Method: for given ranges the model is linear in nugget and structure sill, so those are solved exactly
 * (non-negative, respecting a fixed nugget or total sill); the ranges are found by a log-spaced grid over
 * [0.1·h_min, 10·h_max] of each direction, refined by repeated zooming — robust starting values with no
 * local descent that could leave the bounds. Parameters are never negative or NaN.
 *
 * Options: `nugget` a fixed value, 'fit', or omitted for no nugget; `sill` a fixed total sill
 * (nugget + structure) or 'fit' (default) — holding it at the variance of what is analysed is the usual
 * choice for sequential Gaussian simulation (Deutsch & Journel 1998, ch. V). The returned model lists the
 * nugget structure first when a nugget option is given. Inputs are not mutated.
 * @throws {TypeError} on an unknown type, malformed input or a non-finite azimuth
 * @throws {RangeError} on a negative nugget, a sill not > 0, a nugget above a fixed sill, minPairs < 0
 * @throws {Error} if no bin has enough pairs, or every γ̂ is 0
 */
export function fitVariogram(input: FitInput, opts: FitOptions): VariogramModel {
	if (input === null || typeof input !== 'object') throw new TypeError('input must be { vertical?, horizontal?, horizontalMinor? }');
	if (opts === null || typeof opts !== 'object' || !TYPES.includes(opts.type)) {
		throw new TypeError("type must be 'spherical', 'exponential' or 'gaussian'");
	}
	const { type, nugget, sill = 'fit', minPairs = 30, azimuth = 0 } = opts;
	if (nugget !== undefined && nugget !== 'fit' && !(typeof nugget === 'number' && nugget >= 0 && Number.isFinite(nugget))) {
		throw new RangeError("nugget must be >= 0 or 'fit'");
	}
	if (sill !== 'fit' && !(typeof sill === 'number' && sill > 0 && Number.isFinite(sill))) {
		throw new RangeError("sill must be > 0 or 'fit'");
	}
	if (typeof nugget === 'number' && typeof sill === 'number' && nugget > sill) throw new RangeError('nugget exceeds sill');
	if (!(minPairs >= 0)) throw new RangeError('minPairs must be >= 0');
	if (typeof azimuth !== 'number' || !Number.isFinite(azimuth)) throw new TypeError('azimuth must be a finite number');

	const design = buildDesign(input, minPairs);
	const scaled = (v: number | 'fit' | undefined) => (typeof v === 'number' ? v / design.scale : v);
	const linear = makeLinearSolver(design, type, scaled(nugget), scaled(sill) as number | 'fit');

	const dims = [VERTICAL, MAJOR, MINOR].map((d) => (count(design.dir, d) > 0 ? bounds(design, d) : null));
	const logs = searchRanges(dims, (l) => linear(exp(l[0]), exp(l[1]), exp(l[2])).wss);
	const a = logs.map((l, d) => (dims[d] ? exp(l) : NaN));
	const rangeMajor = dims[MAJOR] ? a[MAJOR] : dims[MINOR] ? a[MINOR] : a[VERTICAL];
	const rangeMinor = dims[MINOR] ? a[MINOR] : rangeMajor;
	const rangeV = dims[VERTICAL] ? a[VERTICAL] : rangeMajor;
	const fitted = linear(rangeV, rangeMajor, rangeMinor);
	// A fixed nugget or sill is returned exactly as given, not as a rescaled round trip.
	const c0 = typeof nugget === 'number' ? nugget : Math.min(fitted.c0 * design.scale, typeof sill === 'number' ? sill : Infinity);
	const c = typeof sill === 'number' ? Math.max(0, sill - c0) : fitted.c * design.scale;

	const structures: Structure[] = [];
	if (nugget !== undefined) structures.push({ type: 'nugget', sill: c0, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 });
	structures.push({ type, sill: c, rangeMajor, rangeMinor, rangeVertical: rangeV });
	return { structures, azimuth };
}

/**
 * Weighted misfit of a model against experimental bins, with the same bins and weights as fitVariogram:
 * wss = Σ N(h)/γ̂(h)² · (γ̂(h) − γ(h))², vertical bins compared with γ(0, 0, h), horizontal bins with γ
 * along the model's major axis and horizontalMinor bins with γ across it. `bins` is the number of bins used;
 * wss / bins is a per-bin misfit that can be compared between models (and across ranges, for a
 * range-sensitivity plot).
 * @throws {TypeError} {RangeError} on an invalid model; {Error} if no bin has enough pairs or every γ̂ is 0
 */
export function variogramMisfit(
	model: VariogramModel,
	input: FitInput,
	opts: { minPairs?: number } = {}
): { wss: number; bins: number } {
	const { minPairs = 30 } = opts;
	if (!(minPairs >= 0)) throw new RangeError('minPairs must be >= 0');
	const m = compileVariogram(model);
	const rot = planRotation(model.azimuth);
	const d = buildDesign(input, minPairs);
	let wss = 0;
	for (let k = 0; k < d.h.length; k++) {
		const h = d.h[k];
		const dir = d.dir[k];
		const gm = dir === VERTICAL ? m.gamma(0, 0, h) : dir === MAJOR ? m.gamma(h * rot.sin, h * rot.cos, 0) : m.gamma(h * rot.cos, -h * rot.sin, 0);
		const r = d.g[k] - gm / d.scale;
		wss += d.w[k] * r * r;
	}
	return { wss, bins: d.h.length };
}

function buildDesign(input: FitInput, minPairs: number): Design {
	if (input === null || typeof input !== 'object') throw new TypeError('input must be { vertical?, horizontal?, horizontalMinor? }');
	const rows: { h: number; g: number; n: number; v: number }[] = [];
	const take = (bins: LagBin[] | undefined, v: number) => {
		if (bins === undefined) return;
		if (!Array.isArray(bins)) throw new TypeError('bins must be an array');
		for (const b of bins) {
			if (b.pairs >= minPairs && b.pairs > 0 && b.h > 0 && Number.isFinite(b.h) && Number.isFinite(b.gamma) && b.gamma >= 0) {
				rows.push({ h: b.h, g: b.gamma, n: b.pairs, v });
			}
		}
	};
	take(input.vertical, VERTICAL);
	take(input.horizontal, MAJOR);
	take(input.horizontalMinor, MINOR);
	if (rows.length === 0) throw new Error('no bins with enough pairs');
	let gmax = 0;
	for (const r of rows) if (r.g > gmax) gmax = r.g;
	if (gmax === 0) throw new Error('experimental variogram is zero');
	const n = rows.length;
	const d: Design = { h: new Float64Array(n), g: new Float64Array(n), w: new Float64Array(n), dir: new Uint8Array(n), scale: gmax };
	rows.forEach((r, k) => {
		// The misfit Σ N/γ̂²·(γ̂ − γ)² is scale-free, so working in units of the largest γ̂ changes nothing else.
		const g = r.g / gmax;
		const gg = Math.max(g, 1e-6);
		d.h[k] = r.h;
		d.g[k] = g;
		d.w[k] = r.n / (gg * gg);
		d.dir[k] = r.v;
	});
	return d;
}

function count(a: Uint8Array, v: number): number {
	let c = 0;
	for (const x of a) if (x === v) c++;
	return c;
}

function bounds(d: Design, v: number): [number, number] {
	let lo = Infinity;
	let hi = 0;
	for (let k = 0; k < d.h.length; k++) {
		if (d.dir[k] !== v) continue;
		if (d.h[k] < lo) lo = d.h[k];
		if (d.h[k] > hi) hi = d.h[k];
	}
	return [ln(0.1 * lo), ln(10 * hi)];
}

type Linear = (aV: number, aMajor: number, aMinor: number) => { c0: number; c: number; wss: number };

/**
 * For fixed ranges, the best non-negative nugget c0 and structure sill c under the options' constraints.
 * The model is γ = c0 + c·f(h) (h > 0 in every used bin), linear in (c0, c).
 */
function makeLinearSolver(d: Design, type: FitOptions['type'], nugget: FitOptions['nugget'], sill: number | 'fit'): Linear {
	const n = d.h.length;
	const f = new Float64Array(n);
	const wssOf = (c0: number, c: number) => {
		let s = 0;
		for (let k = 0; k < n; k++) {
			const r = d.g[k] - c0 - c * f[k];
			s += d.w[k] * r * r;
		}
		return s;
	};
	return (aV, aMajor, aMinor) => {
		const a = [aV, aMajor, aMinor];
		let sw = 0;
		let swf = 0;
		let swff = 0;
		let swg = 0;
		let swfg = 0;
		for (let k = 0; k < n; k++) {
			const fk = unitGamma(type, d.h[k] / a[d.dir[k]]);
			f[k] = fk;
			const w = d.w[k];
			sw += w;
			swf += w * fk;
			swff += w * fk * fk;
			swg += w * d.g[k];
			swfg += w * fk * d.g[k];
		}
		let c0 = 0;
		let c = 0;
		if (nugget === undefined || typeof nugget === 'number') {
			c0 = nugget ?? 0;
			if (typeof sill === 'number') c = sill - c0;
			// Least squares for c on the residual γ̂ − c0, kept non-negative.
			else c = Math.max(0, (swfg - c0 * swf) / swff);
		} else if (typeof sill === 'number') {
			// c = S − c0: γ̂ − S·f = c0·(1 − f); least squares for c0, within [0, S]:
			// c0 = Σw(1 − f)(γ̂ − S·f) / Σw(1 − f)².
			const sw1 = sw - 2 * swf + swff;
			const num = swg - swfg - sill * (swf - swff);
			c0 = sw1 > 0 ? Math.min(sill, Math.max(0, num / sw1)) : 0;
			c = sill - c0;
		} else {
			const det = sw * swff - swf * swf;
			let best = { c0: 0, c: Math.max(0, swfg / swff), wss: Infinity };
			best.wss = wssOf(best.c0, best.c);
			const pure = { c0: Math.max(0, swg / sw), c: 0, wss: 0 };
			pure.wss = wssOf(pure.c0, pure.c);
			if (pure.wss < best.wss) best = pure;
			if (det > 1e-12 * sw * swff) {
				const u0 = (swff * swg - swf * swfg) / det;
				const u = (sw * swfg - swf * swg) / det;
				if (u0 >= 0 && u >= 0) {
					const wss = wssOf(u0, u);
					if (wss <= best.wss) best = { c0: u0, c: u, wss };
				}
			}
			return best;
		}
		return { c0, c, wss: wssOf(c0, c) };
	};
}

/**
 * Minimises obj over the log-ranges of the directions that have bounds (null: not searched, its value is
 * irrelevant to obj and returned as 0): a log grid of 41 points per searched direction (21 when all three
 * are: 9261 points), then twelve zooms of an 11-point grid to ±2 steps of the best point (final log step about
 * 2e-6 of the span with 41 points). Points are visited with the first direction outermost.
 */
function searchRanges(dims: ([number, number] | null)[], obj: (l: number[]) => number): number[] {
	const active = dims.map((_, i) => i).filter((i) => dims[i] !== null);
	let centre = dims.map((b) => (b ? (b[0] + b[1]) / 2 : 0));
	let half = dims.map((b) => (b ? (b[1] - b[0]) / 2 : 0));
	let points = active.length === 3 ? 21 : 41;
	let best = { l: centre.slice(), val: Infinity };
	const l = dims.map(() => 0);
	for (let level = 0; level <= 12; level++) {
		const steps = dims.map((b, i) => (b ? (2 * half[i]) / (points - 1) : 0));
		const visit = (a: number) => {
			if (a === active.length) {
				const val = obj(l);
				// Strict improvement only, so ties keep the first (smallest-range) point: deterministic.
				if (val < best.val) best = { l: l.slice(), val };
				return;
			}
			const d = active[a];
			for (let i = 0; i < points; i++) {
				l[d] = clamp(centre[d] - half[d] + i * steps[d], dims[d]!);
				visit(a + 1);
			}
		};
		visit(0);
		centre = best.l.slice();
		half = steps.map((s) => 2 * s);
		points = 11;
	}
	return best.l;
}

function clamp(x: number, b: [number, number]): number {
	return Math.min(b[1], Math.max(b[0], x));
}
