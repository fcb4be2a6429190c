import { eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import type { DbOrTx } from '$lib/server/db/transaction';
import { projects } from '$lib/server/db/schema';
import { siteSettings } from '$lib/server/db/site-schema';
import { ServiceError } from '$lib/server/errors';
import { checkPolyline } from '$lib/site';
import { COORDINATE_LIMIT } from '$lib/schemas/bounds';

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
			if (input.sectionLine.some((p) => Math.abs(p[0]) > COORDINATE_LIMIT || Math.abs(p[1]) > COORDINATE_LIMIT)) {
				throw new RangeError('section line coordinates must lie within ±100,000,000');
			}
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
