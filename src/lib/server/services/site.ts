import { eq } from 'drizzle-orm';
import { getDb, type Db } from '$lib/server/db';
import { projects } from '$lib/server/db/schema';
import { siteSettings, type Sounding } from '$lib/server/db/site-schema';
import { ServiceError } from '$lib/server/errors';
import { COORDINATE_LIMIT } from '$lib/schemas/bounds';

/** A database or a transaction on one; services take either so a caller can group writes. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

/** The site settings of a project as they leave the server (defaults filled in when none are stored). */
export interface SiteView {
	geometry: '2d' | '3d';
	/** Plan polyline [[x, y], …]; chainage runs from its first point. Null until one is entered. */
	sectionLine: [number, number][] | null;
	/** Soundings farther than this from the section line are flagged (project length unit). */
	offLineTolerance: number;
	/** Project-wide groundwater elevation; a sounding may override it. Null until one is entered. */
	groundwaterElevation: number | null;
	lengthUnit: 'm' | 'ft';
}

export interface SiteUpdate {
	geometry?: '2d' | '3d';
	sectionLine?: [number, number][] | null;
	offLineTolerance?: number;
	groundwaterElevation?: number | null;
}

const DEFAULT_TOLERANCE = 25;

/** The project's site settings; the defaults (2D, no line, tolerance 25, no groundwater) when none are stored. */
export function getSite(projectId: string, db: DbOrTx = getDb()): SiteView {
	const row = db.select().from(siteSettings).where(eq(siteSettings.projectId, projectId)).get();
	const project = db.select({ lengthUnit: projects.lengthUnit }).from(projects).where(eq(projects.id, projectId)).get();
	if (!project) throw new ServiceError(404, 'Project not found.');
	return {
		geometry: row?.geometry ?? '2d',
		sectionLine: row?.sectionLine ?? null,
		offLineTolerance: row?.offLineTolerance ?? DEFAULT_TOLERANCE,
		groundwaterElevation: row?.groundwaterElevation ?? null,
		lengthUnit: project.lengthUnit
	};
}

/** Stores the given fields of the site settings (others unchanged) and returns the result. */
export function updateSite(projectId: string, input: SiteUpdate, db: DbOrTx = getDb()): SiteView {
	if (input.sectionLine) {
		try {
			checkPolyline(input.sectionLine);
		} catch (err) {
			throw new ServiceError(422, err instanceof Error ? `The section line is not valid: ${err.message}.` : 'The section line is not valid.');
		}
	}
	const values = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) as SiteUpdate;
	db.insert(siteSettings)
		.values({ projectId, ...values })
		.onConflictDoUpdate({ target: siteSettings.projectId, set: { ...values, updatedAt: new Date() } })
		.run();
	return getSite(projectId, db);
}

/** Where a point projects onto a polyline. */
export interface Projection {
	/** Distance along the polyline from its first point to the foot of the perpendicular. */
	chainage: number;
	/** Signed distance from the line: positive to the right looking in the direction of increasing chainage. */
	offset: number;
	/** Index of the segment the point projects onto. */
	segment: number;
}

/**
 * Projects a plan point onto a polyline: the foot of the perpendicular on the nearest segment gives the
 * chainage (distance along the line) and the signed offset. The first and last segments are extended
 * beyond the line's ends, so a point just before the start gets a negative chainage rather than being
 * pinned to 0 (common practice for stationing). On equal distances the earlier segment wins.
 * Zero-length segments are skipped. Total for finite input: distances are computed with Math.hypot, which
 * does not overflow where a sum of squares would (a point at 1e160), and the first segment stands in should
 * every distance still be NaN; the result may then hold non-finite numbers, which `locateSounding` treats as
 * not located.
 * @throws {RangeError} when the line has fewer than two distinct points or a coordinate is not finite
 */
export function projectOntoPolyline(line: ReadonlyArray<readonly [number, number]>, x: number, y: number): Projection {
	checkLineShape(line);
	if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError('point coordinates must be finite');
	const segments: { ax: number; ay: number; dx: number; dy: number; len: number; start: number; index: number }[] = [];
	let start = 0;
	for (let i = 0; i + 1 < line.length; i++) {
		const [ax, ay] = line[i];
		const dx = line[i + 1][0] - ax;
		const dy = line[i + 1][1] - ay;
		const len = Math.hypot(dx, dy);
		if (len > 0) segments.push({ ax, ay, dx, dy, len, start, index: i });
		start += len;
	}
	let best: Projection | undefined;
	let bestDistance = Infinity;
	segments.forEach((s, k) => {
		// t from unit vectors, so no product of two large lengths is formed.
		let t = (((x - s.ax) / s.len) * (s.dx / s.len) + ((y - s.ay) / s.len) * (s.dy / s.len));
		if (k > 0 && t < 0) t = 0;
		if (k < segments.length - 1 && t > 1) t = 1;
		const fx = s.ax + t * s.dx;
		const fy = s.ay + t * s.dy;
		const distance = Math.hypot(x - fx, y - fy);
		if (best === undefined || distance < bestDistance) {
			bestDistance = distance;
			// The cross product of the direction with the point's vector is negative on the right.
			const cross = (s.dx / s.len) * (y - s.ay) - (s.dy / s.len) * (x - s.ax);
			best = { chainage: s.start + t * s.len, offset: cross > 0 ? -distance : distance, segment: s.index };
		}
	});
	return best as Projection;
}

/** Length of a polyline. */
export function polylineLength(line: ReadonlyArray<readonly [number, number]>): number {
	let total = 0;
	for (let i = 0; i + 1 < line.length; i++) {
		total += Math.hypot(line[i + 1][0] - line[i][0], line[i + 1][1] - line[i][1]);
	}
	return total;
}

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
 * line, else the chainage stored with the sounding (files located by chainage only), else none.
 */
export function locateSounding(site: Pick<SiteView, 'sectionLine' | 'offLineTolerance'>, s: Pick<Sounding, 'x' | 'y' | 'chainage'>): SoundingLocation {
	if (site.sectionLine && site.sectionLine.length >= 2 && s.x != null && s.y != null) {
		const p = projectOntoPolyline(site.sectionLine, s.x, s.y);
		// Only coordinates beyond the entry points' bounds (stored before they were checked) get here.
		if (!Number.isFinite(p.chainage) || !Number.isFinite(p.offset)) return { chainage: null, offset: null, farOffLine: true, source: 'none' };
		return { chainage: p.chainage, offset: p.offset, farOffLine: Math.abs(p.offset) > site.offLineTolerance, source: 'projected' };
	}
	if (s.chainage != null) return { chainage: s.chainage, offset: null, farOffLine: false, source: 'given' };
	return { chainage: null, offset: null, farOffLine: false, source: 'none' };
}

/** What a section line entered through the API or a form must satisfy: a line of finite points within the bounds. */
function checkPolyline(line: ReadonlyArray<readonly [number, number]>): void {
	checkLineShape(line);
	if (line.some((p) => Math.abs(p[0]) > COORDINATE_LIMIT || Math.abs(p[1]) > COORDINATE_LIMIT)) {
		throw new RangeError('section line coordinates must lie within ±100,000,000');
	}
}

function checkLineShape(line: ReadonlyArray<readonly [number, number]>): void {
	if (!Array.isArray(line)) throw new RangeError('the section line must be a list of points');
	for (const p of line) {
		if (!Array.isArray(p) || p.length !== 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) {
			throw new RangeError('section line points must be [x, y] with finite coordinates');
		}
	}
	if (!(polylineLength(line) > 0)) throw new RangeError('the section line needs two distinct points');
}
