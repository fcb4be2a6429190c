import exp from '@stdlib/math-base-special-exp';
import ln from '@stdlib/math-base-special-ln';
import { planRotation, unitGamma, type VariogramMap } from '../geostat';
import type { ModelParameters } from './types';

/**
 * The map needs pairs in more than one direction: the weighted second moment of the pairs' offsets across
 * their main direction must be at least this share of the moment along it (offsets within about ±13° of one
 * line give less).
 */
const MIN_SPREAD = 0.05;

/** The plan anisotropy read off a variogram map. */
export interface MapAnisotropy {
	/** Direction of greatest continuity, whole degrees clockwise from north in [0, 180). */
	azimuth: number;
	rangeMajor: number;
	rangeMinor: number;
	/** Map cells used (at least minPairs pairs) and the weighted misfit per cell. */
	cells: number;
	perCell: number;
}

/**
 * The direction of greatest continuity in plan, fitted to a variogram map: the azimuth and the two plan
 * ranges of geometric anisotropy (Deutsch & Journel 1998, ch. II; Isaaks & Srivastava 1989, ch. 7) that
 * minimise the weighted misfit Σ N/γ̂² (γ̂ − γ(dx, dy))² over the map's cells with at least minPairs pairs
 * (Cressie 1985 weights, as fitVariogram), the structure type, nugget and sill held at the given parameters.
 *
 * Method: a first direction from the map's covariance C = sill − γ̂, the azimuth along which its second
 * moment Σ N·C·(offset along the azimuth)² is largest (the axis of inertia of the covariance map), scanned
 * every degree; then the weighted least-squares fit at azimuths every 10° within ±30° of it, refined by 5°,
 * 2° and 1° steps around the best, each with its two ranges searched on a log grid over [0.1·h_min, 10·h_max]
 * of the cells' separations and refined by zooming. The major range is the larger (the azimuth turned by
 * 90° if needed).
 * @throws {Error} 'no map cells with enough pairs' when fewer than three cells qualify; 'the soundings lie nearly
 *   on one line in plan …' when the pairs' offsets spread too little across their main direction (MIN_SPREAD)
 */
export function mapAnisotropy(map: VariogramMap, params: Pick<ModelParameters, 'type' | 'nugget' | 'sill'>, minPairs: number): MapAnisotropy {
	const idx: number[] = [];
	for (let c = 0; c < map.pairs.length; c++) {
		const h2 = map.dx[c] * map.dx[c] + map.dy[c] * map.dy[c];
		if (map.pairs[c] >= minPairs && map.pairs[c] > 0 && Number.isFinite(map.gamma[c]) && h2 > 0) idx.push(c);
	}
	if (idx.length < 3) throw new Error('no map cells with enough pairs');
	const n = idx.length;
	const dx = Float64Array.from(idx, (c) => map.dx[c]);
	const dy = Float64Array.from(idx, (c) => map.dy[c]);
	const g = Float64Array.from(idx, (c) => map.gamma[c]);
	let gmax = 0;
	for (const v of g) gmax = Math.max(gmax, v);
	const w = Float64Array.from(idx, (c, k) => {
		const gg = Math.max(g[k], 1e-6 * gmax);
		return map.pairs[c] / (gg * gg);
	});
	let hmin = Infinity;
	let hmax = 0;
	for (let k = 0; k < n; k++) {
		const h = Math.sqrt(dx[k] * dx[k] + dy[k] * dy[k]);
		hmin = Math.min(hmin, h);
		hmax = Math.max(hmax, h);
	}

	// First direction: the axis of inertia of the covariance map. Alongside, the spread of the pairs' offsets
	// by direction: soundings on one line in plan give offsets along that line only.
	let start = 0;
	let most = -Infinity;
	let spreadMin = Infinity;
	let spreadMax = 0;
	for (let az = 0; az < 180; az++) {
		const rot = planRotation(az);
		let s = 0;
		let spread = 0;
		for (let k = 0; k < n; k++) {
			const u = dx[k] * rot.sin + dy[k] * rot.cos;
			spread += map.pairs[idx[k]] * u * u;
			const cov = params.sill - g[k];
			if (cov <= 0) continue;
			s += map.pairs[idx[k]] * cov * u * u;
		}
		spreadMin = Math.min(spreadMin, spread);
		spreadMax = Math.max(spreadMax, spread);
		if (s > most) {
			most = s;
			start = az;
		}
	}
	if (spreadMin < MIN_SPREAD * spreadMax) throw new Error('the soundings lie nearly on one line in plan, so the map cannot show a direction of greatest continuity');

	const lo = ln(0.1 * hmin);
	const hi = ln(10 * hmax);
	const c0 = params.nugget;
	const c = params.sill - params.nugget;
	const uu = new Float64Array(n);
	const vv = new Float64Array(n);
	const fitAt = (az: number) => {
		const rot = planRotation(az);
		for (let k = 0; k < n; k++) {
			const u = dx[k] * rot.sin + dy[k] * rot.cos;
			const v = dx[k] * rot.cos - dy[k] * rot.sin;
			uu[k] = u * u;
			vv[k] = v * v;
		}
		return search2(lo, hi, (la, lb) => {
			const ia = exp(-2 * la);
			const ib = exp(-2 * lb);
			let s = 0;
			for (let k = 0; k < n; k++) {
				const e = g[k] - c0 - c * unitGamma(params.type, Math.sqrt(uu[k] * ia + vv[k] * ib));
				s += w[k] * e * e;
			}
			return s;
		});
	};
	const tried = new Map<number, { la: number; lb: number; val: number }>();
	let best = { az: start, la: 0, lb: 0, val: Infinity };
	const tryAz = (a: number) => {
		const az = (((a % 180) + 180) % 180);
		if (tried.has(az)) return;
		const r = fitAt(az);
		tried.set(az, r);
		// Ties keep the direction nearest the first one (tried first).
		if (r.val < best.val) best = { az, ...r };
	};
	// Every 10° within ±30° of the first direction, then 5°, 2° and 1° around the best so far.
	for (let d = -30; d <= 30; d += 10) tryAz(start + d);
	for (const step of [5, 2, 1]) {
		const centre = best.az;
		tryAz(centre - step);
		tryAz(centre + step);
	}
	let { az, la, lb } = best;
	if (lb > la) {
		[la, lb] = [lb, la];
		az = (az + 90) % 180;
	}
	return { azimuth: az, rangeMajor: exp(la), rangeMinor: exp(lb), cells: n, perCell: best.val / n };
}

/** A 15 × 15 log grid, then six zooms of 9 × 9 to ±2 steps of the best point (about 700 points); ties keep the first. */
function search2(lo: number, hi: number, obj: (a: number, b: number) => number): { la: number; lb: number; val: number } {
	let ca = (lo + hi) / 2;
	let cb = ca;
	let half = (hi - lo) / 2;
	let points = 15;
	let best = { la: ca, lb: cb, val: Infinity };
	for (let level = 0; level <= 6; level++) {
		const step = (2 * half) / (points - 1);
		for (let i = 0; i < points; i++) {
			const la = Math.min(hi, Math.max(lo, ca - half + i * step));
			for (let j = 0; j < points; j++) {
				const lb = Math.min(hi, Math.max(lo, cb - half + j * step));
				const val = obj(la, lb);
				if (val < best.val) best = { la, lb, val };
			}
		}
		ca = best.la;
		cb = best.lb;
		half = 2 * step;
		points = 9;
	}
	return best;
}
