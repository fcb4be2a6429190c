import type { LagBin } from '../geostat';
import type { Plateau, PlateauCheck } from './types';

/** A plateau further than this share from the variance of what is analysed draws the warning. */
export const PLATEAU_TOLERANCE = 0.2;

/** The plateau is read over the usable bins beyond this share of the largest usable separation. */
const OUTER = 2 / 3;

/** A plateau resting on fewer pairs than this is called a rough figure in the warning. */
const FEW_PAIRS = 300;

/**
 * Compares each direction's experimental plateau with the variance of what is analysed — the sill a model
 * for sequential Gaussian simulation must have (1 for normal scores; Deutsch & Journel 1998, ch. V):
 * the plateau is the pair-weighted mean γ̂ of the usable bins (at least minPairs pairs) in the outer third of
 * the direction's usable separations (where a stationary variogram has levelled off and a trend keeps rising). A plateau more than PLATEAU_TOLERANCE (20 %) above or below the
 * variance is a departure; the advice names the likely causes (a trend, zonal anisotropy, mixed
 * populations — Journel & Huijbregts 1978; Goovaerts 1997, ch. 4, from memory) and what to do.
 * A direction needs two usable bins to have a plateau.
 */
export function plateauCheck(
	bins: { vertical: LagBin[]; horizontal: LagBin[]; horizontalMinor?: LagBin[] | null },
	variance: number,
	minPairs: number
): PlateauCheck {
	const vertical = plateauOf(bins.vertical, variance, minPairs);
	const horizontal = plateauOf(bins.horizontal, variance, minPairs);
	const minor = bins.horizontalMinor ? plateauOf(bins.horizontalMinor, variance, minPairs) : null;
	const departures: string[] = [];
	const say = (name: string, p: Plateau | null) => {
		if (!p || Math.abs(p.ratio - 1) <= PLATEAU_TOLERANCE) return;
		const pct = Math.round(Math.abs(p.ratio - 1) * 100);
		const rough = p.pairs < FEW_PAIRS ? ` Only ${p.pairs} pairs in ${p.bins} bin${p.bins === 1 ? '' : 's'} carry this: a rough figure.` : '';
		departures.push(
			`The ${name} variogram levels off at ${fmt(p.gamma)}, ${pct} % ${p.ratio > 1 ? 'above' : 'below'} the variance of what is analysed (${fmt(variance)}), over ${fmt(p.from)}–${fmt(p.to)}.${rough}`
		);
	};
	say('vertical', vertical);
	say(minor ? 'horizontal (along the azimuth)' : 'horizontal', horizontal);
	say('horizontal (across the azimuth)', minor);
	return { vertical, horizontal, minor, departures, advice: departures.length ? advise(vertical, horizontal, minor) : null };
}

function plateauOf(bins: LagBin[], variance: number, minPairs: number): Plateau | null {
	const usable = bins.filter((b) => b.pairs >= minPairs && b.pairs > 0 && Number.isFinite(b.gamma) && b.h > 0);
	if (usable.length < 2 || !(variance > 0)) return null;
	const hMax = usable.reduce((m, b) => Math.max(m, b.h), 0);
	const outer = usable.filter((b) => b.h >= (OUTER * hMax));
	let n = 0;
	let s = 0;
	for (const b of outer) {
		n += b.pairs;
		s += b.pairs * b.gamma;
	}
	const gamma = s / n;
	return { gamma, ratio: gamma / variance, bins: outer.length, pairs: n, from: outer[0].h, to: outer[outer.length - 1].h };
}

function advise(vertical: Plateau | null, horizontal: Plateau | null, minor: Plateau | null): string {
	const high = (p: Plateau | null) => !!p && p.ratio > 1 + PLATEAU_TOLERANCE;
	const low = (p: Plateau | null) => !!p && p.ratio < 1 - PLATEAU_TOLERANCE;
	const hints: string[] = [];
	if (high(vertical)) hints.push('a vertical variogram that keeps rising above the variance usually means a trend with depth: try a trend of the mean with elevation');
	if (high(horizontal) || high(minor)) {
		hints.push('a horizontal variogram above the variance points to a trend across the site or mixed populations: try a trend in plan, or split the domain where the soil changes');
	}
	if (low(horizontal) || low(minor)) {
		hints.push(
			'a horizontal variogram below the variance points to zonal anisotropy (layering: soundings differ less at one level than the domain does over its depth) or to horizontal lags that stop short of the range: look for a trend with depth, or lengthen the horizontal lags'
		);
	}
	if (low(vertical)) hints.push('a vertical variogram below the variance means the vertical lags stop short of the range, or each sounding varies less than the domain does: lengthen the vertical lags, or look for differences between soundings (a trend in plan, mixed populations)');
	return (
		'Likely causes: a trend, zonal anisotropy or mixed populations (two soils in one domain). ' +
		hints.map((h) => h[0].toUpperCase() + h.slice(1)).join('. ') +
		'. With the sill held at the variance the model cannot follow this direction; check the units, contacts and the domain’s distribution before simulating, and free the sill only to study the data, not for simulation.'
	);
}

function fmt(v: number): string {
	return String(Number(v.toPrecision(3)));
}
