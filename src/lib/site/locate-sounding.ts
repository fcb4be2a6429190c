import { projectOntoPolyline, type Polyline } from './project-onto-polyline';

/** A sounding's place in the section. */
export interface SoundingLocation {
	/** Chainage along the section line; null when neither a line and easting/northing nor a given chainage exist. */
	chainage: number | null;
	/** Signed offset from the section line; null when not projected. */
	offset: number | null;
	/** True when |offset| exceeds the site's off-line tolerance. */
	farOffLine: boolean;
	/** Where the chainage came from. */
	source: 'projected' | 'given' | 'none';
}

/**
 * Locates a sounding in the section: projected from its easting/northing when the site has a section
 * line ({@link projectOntoPolyline}), else the chainage stored with the sounding (files located by chainage
 * only), else none.
 */
export function locateSounding(
	site: { sectionLine: Polyline | null; offLineTolerance: number },
	s: { x: number | null; y: number | null; chainage: number | null }
): SoundingLocation {
	if (site.sectionLine && site.sectionLine.length >= 2 && s.x != null && s.y != null) {
		const p = projectOntoPolyline(site.sectionLine, s.x, s.y);
		// Only coordinates beyond the entry points' bounds (stored before they were checked) get here.
		if (!Number.isFinite(p.chainage) || !Number.isFinite(p.offset)) return { chainage: null, offset: null, farOffLine: true, source: 'none' };
		return { chainage: p.chainage, offset: p.offset, farOffLine: Math.abs(p.offset) > site.offLineTolerance, source: 'projected' };
	}
	if (s.chainage != null) return { chainage: s.chainage, offset: null, farOffLine: false, source: 'given' };
	return { chainage: null, offset: null, farOffLine: false, source: 'none' };
}
