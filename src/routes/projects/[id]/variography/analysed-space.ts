import type { VariogramSettings } from '$lib/variography';

/** The settings that decide which values the variograms are computed on (not how they are binned). */
export type SpaceSettings = Pick<VariogramSettings, 'transform' | 'declustered' | 'trend'>;

/**
 * The analysed space of a domain under settings: the domain (hence its property) and what is done to its
 * values before the variograms (transform, weights, trend). A model belongs to one space; bins of another
 * space are values of another variable.
 */
export function analysedSpace(domainId: string, s: SpaceSettings): string {
	return JSON.stringify([domainId, s.transform, s.declustered, s.trend ?? 'none']);
}

/** A space in words, e.g. "normal scores, declustered, trend with elevation removed". */
export function describeSpace(s: SpaceSettings): string {
	const trend = { none: 'no trend', elevation: 'trend with elevation removed', 'elevation-plan': 'trend with elevation and in plan removed' }[s.trend ?? 'none'];
	return `${s.transform === 'normal-score' ? 'normal scores' : 'raw values'}, ${s.declustered ? 'declustered' : 'equal weights'}, ${trend}`;
}
