import type { DomainSamplesData, VariogramSettings } from './types';

/**
 * Starting experimental settings for a domain, read off its sample geometry (the user then adjusts them):
 * - vertical lag: the median reading spacing within soundings, at least 0.1 m (0.3 ft), rounded to a
 *   1-2-2.5-5 step; enough lags to reach 3 m (10 ft), at most 40 — CPT vertical ranges are typically a few
 *   tenths of a metre to about 2 m (Phoon & Kulhawy 1999, from memory);
 * - horizontal lag: the median distance from each sounding to its nearest neighbour, rounded likewise;
 *   lags to half the largest sounding separation, at most 30; a vertical band of half the vertical lag
 *   or one reading spacing, whichever is larger (wider bands mix vertical separation into horizontal pairs);
 * - lag tolerance half the lag; bins with fewer than 30 pairs left out of fits (common practice);
 * - declustering weights when the domain sets a declustering cell, else equal weights (which is what the
 *   weights are without one), so the settings and the domain's summary say the same; no trend.
 */
export function defaultSettings(
	data: Pick<DomainSamplesData, 'samples' | 'lengthUnit'> & { domain?: { declusterCell: object | null } }
): VariogramSettings {
	const ft = data.lengthUnit === 'ft';
	const { x, y, z, sounding } = data.samples;
	const bySounding = new Map<string, { z: number[]; x: number; y: number; n: number }>();
	for (let i = 0; i < z.length; i++) {
		let g = bySounding.get(sounding[i]);
		if (!g) bySounding.set(sounding[i], (g = { z: [], x: 0, y: 0, n: 0 }));
		g.z.push(z[i]);
		g.x += x[i];
		g.y += y[i];
		g.n++;
	}
	const gaps: number[] = [];
	const centres: [number, number][] = [];
	for (const g of bySounding.values()) {
		const zs = g.z.slice().sort((a, b) => a - b);
		for (let i = 1; i < zs.length; i++) if (zs[i] > zs[i - 1]) gaps.push(zs[i] - zs[i - 1]);
		centres.push([g.x / g.n, g.y / g.n]);
	}
	const dz = median(gaps) ?? (ft ? 0.3 : 0.1);
	const vLag = nice(Math.max(dz, ft ? 0.3 : 0.1));
	const nearest: number[] = [];
	let maxSep = 0;
	for (let i = 0; i < centres.length; i++) {
		let best = Infinity;
		for (let j = 0; j < centres.length; j++) {
			if (i === j) continue;
			const d = Math.hypot(centres[i][0] - centres[j][0], centres[i][1] - centres[j][1]);
			if (d > 0 && d < best) best = d;
			if (d > maxSep) maxSep = d;
		}
		if (Number.isFinite(best)) nearest.push(best);
	}
	const hLag = nice(median(nearest) ?? (ft ? 30 : 10));
	return {
		transform: 'normal-score',
		declustered: data.domain ? data.domain.declusterCell !== null : true,
		trend: 'none',
		vertical: { lag: vLag, nLags: Math.min(40, Math.max(5, Math.ceil((ft ? 10 : 3) / vLag))), lagTolerance: vLag / 2 },
		horizontal: {
			lag: hLag,
			nLags: Math.min(30, Math.max(5, Math.ceil(maxSep / 2 / hLag))),
			lagTolerance: hLag / 2,
			verticalBand: round(Math.max(vLag / 2, dz)),
			azimuth: null,
			angleTolerance: 22.5
		},
		minPairs: 30
	};
}

function median(a: number[]): number | undefined {
	if (a.length === 0) return undefined;
	const s = a.slice().sort((p, q) => p - q);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** The 1-2-2.5-5 × 10ᵏ step nearest to v (from below). */
function nice(v: number): number {
	const k = Math.floor(Math.log10(v));
	const base = 10 ** k;
	// A hair below each step so 0.2 / 0.1 = 1.9999999999999998 still counts as 2.
	const m = (v / base) * (1 + 1e-9);
	const step = m >= 5 ? 5 : m >= 2.5 ? 2.5 : m >= 2 ? 2 : 1;
	return round(step * base);
}

/** Rounds away binary noise (0.1 × 3 → 0.3) so settings read cleanly. */
function round(v: number): number {
	return Number(v.toPrecision(6));
}
