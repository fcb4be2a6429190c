import { and, asc, count, eq, sql } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { fromFloat64Blob } from '$lib/server/db/float64';
import { contacts, soundings, sourceFiles, type SourceFormat } from '$lib/server/db/site-schema';
import { ServiceError } from '$lib/server/errors';
import { refreshInterpolatedContacts } from './contacts';
import { recordAudit } from './audit';
import { deriveSounding, jsonColumn, type UnitAtSoundingView } from './derived';
import { READINGS_PER_SOUNDING_MAX } from '$lib/schemas/bounds';
import { readingsPageJson, type ReadingsPage, type ReadingsPageView } from './sounding-readings';
import type { DbOrTx } from '$lib/server/db/transaction';
import { locateSounding } from '$lib/site';
import { getSite, type SiteView } from './site';

/** A sounding as the table lists it: location, extent and where it came from, without its readings. */
export interface SoundingSummary {
	id: string;
	name: string;
	x: number | null;
	y: number | null;
	/** Chainage in the section: projected from x, y onto the section line, else as the file gave it. */
	chainage: number | null;
	/** Signed offset from the section line when projected. */
	offset: number | null;
	farOffLine: boolean;
	chainageSource: 'projected' | 'given' | 'none';
	groundElevation: number;
	areaRatio: number;
	groundwaterElevation: number | null;
	readings: number;
	/** m below ground. */
	maxDepth: number;
	/** kPa. */
	maxQc: number;
	sourceFile: { id: string; name: string; format: SourceFormat } | null;
	/** Its contacts are interpolated from its neighbours and follow them: it has none of its own and nobody has edited them. */
	contactsInterpolated: boolean;
	createdAt: string;
}

/** The measured columns of one sounding, decoded from their Float64 BLOBs (m, kPa; NaN where void). */
export interface SoundingColumns {
	depth: Float64Array;
	qc: Float64Array;
	fs: Float64Array;
	u2: Float64Array | null;
	/** Extra columns as they stood in the file, by name. */
	extras: Record<string, Float64Array>;
}

export interface SoundingDetail extends SoundingSummary {
	columns: SoundingColumns;
}

const summaryColumns = {
	id: soundings.id,
	name: soundings.name,
	x: soundings.x,
	y: soundings.y,
	chainage: soundings.chainage,
	groundElevation: soundings.groundElevation,
	areaRatio: soundings.areaRatio,
	groundwaterElevation: soundings.groundwaterElevation,
	readings: soundings.readings,
	maxDepth: soundings.maxDepth,
	maxQc: soundings.maxQc,
	contactsEdited: soundings.contactsEdited,
	measuredContacts: sql<number>`(select count(*) from ${contacts} where ${contacts.soundingId} = ${soundings.id} and ${contacts.interpolated} = 0)`,
	createdAt: soundings.createdAt,
	fileId: sourceFiles.id,
	fileName: sourceFiles.name,
	fileFormat: sourceFiles.format
};

type SummaryRow = Omit<SoundingSummary, 'sourceFile' | 'createdAt' | 'offset' | 'farOffLine' | 'chainageSource' | 'contactsInterpolated'> & {
	contactsEdited: boolean;
	measuredContacts: number;
	createdAt: Date;
	fileId: string | null;
	fileName: string | null;
	fileFormat: SourceFormat | null;
};

function summaryOf(r: SummaryRow, site: SiteView): SoundingSummary {
	const at = locateSounding(site, r);
	return {
		id: r.id,
		name: r.name,
		x: r.x,
		y: r.y,
		chainage: at.chainage,
		offset: at.offset,
		farOffLine: at.farOffLine,
		chainageSource: at.source,
		groundElevation: r.groundElevation,
		areaRatio: r.areaRatio,
		groundwaterElevation: r.groundwaterElevation,
		readings: r.readings,
		maxDepth: r.maxDepth,
		maxQc: r.maxQc,
		sourceFile: r.fileId && r.fileName && r.fileFormat ? { id: r.fileId, name: r.fileName, format: r.fileFormat } : null,
		contactsInterpolated: !r.contactsEdited && r.measuredContacts === 0,
		createdAt: r.createdAt.toISOString()
	};
}

/** The project's soundings by name (natural order, so LV-2 sorts before LV-10). */
export function listSoundings(projectId: string, db: DbOrTx = getDb()): SoundingSummary[] {
	const rows = db
		.select(summaryColumns)
		.from(soundings)
		.leftJoin(sourceFiles, eq(sourceFiles.id, soundings.sourceFileId))
		.where(eq(soundings.projectId, projectId))
		.orderBy(asc(soundings.name))
		.all();
	const byName = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
	const site = getSite(projectId, db);
	return rows.map((r) => summaryOf(r, site)).sort((a, b) => byName.compare(a.name, b.name));
}

/**
 * One sounding with its readings decoded.
 * @throws ServiceError 404 when the sounding is not in the project.
 */
export function getSounding(projectId: string, soundingId: string, db: DbOrTx = getDb()): SoundingDetail {
	const row = db
		.select({ ...summaryColumns, depth: soundings.depth, qc: soundings.qc, fs: soundings.fs, u2: soundings.u2, extras: soundings.extras })
		.from(soundings)
		.leftJoin(sourceFiles, eq(sourceFiles.id, soundings.sourceFileId))
		.where(and(eq(soundings.projectId, projectId), eq(soundings.id, soundingId)))
		.get();
	if (!row) throw new ServiceError(404, 'Sounding not found.');
	const extras: Record<string, Float64Array> = {};
	for (const [name, base64] of Object.entries(row.extras ?? {})) extras[name] = fromFloat64Blob(Buffer.from(base64, 'base64'));
	return {
		...summaryOf(row, getSite(projectId, db)),
		columns: {
			depth: fromFloat64Blob(row.depth),
			qc: fromFloat64Blob(row.qc),
			fs: fromFloat64Blob(row.fs),
			u2: row.u2 ? fromFloat64Blob(row.u2) : null,
			extras
		}
	};
}

/** A numeric column in JSON: NaN and ±Infinity become null. */
export type JsonColumn = (number | null)[];

/** GET …/soundings/[sid]: one sounding with its measured columns (m, kPa) and derived properties, as JSON. */
export interface SoundingDetailView {
	sounding: SoundingSummary;
	groundwater: { elevation: number; source: 'sounding' | 'project' | 'assumed' };
	/** Which readings the columns hold: `offset` … `offset + count` of `total`; `next` is the URL of the next page. */
	readings: ReadingsPageView;
	columns: { depth: JsonColumn; qc: JsonColumn; fs: JsonColumn; u2: JsonColumn | null; extras: Record<string, JsonColumn> };
	/** The CPT pipeline's columns by name (qt, Ic, qc1Ncs, suRatio …; see DerivedSounding in $lib/cpt). */
	derived: Record<string, JsonColumn>;
	/** Index into `units` of each reading's unit, −1 for none. */
	unit: number[];
	/** CptFlag bitmask per reading. */
	flags: number[];
	units: UnitAtSoundingView[];
	warnings: string[];
}

/**
 * One sounding as the profile page reads it: getSounding's columns and deriveSounding's properties, for the
 * readings of one page (default: all, up to READINGS_PER_SOUNDING_MAX; see readingsPageSchema).
 * @throws ServiceError 404 when the sounding is not in the project.
 */
export function soundingDetailView(
	projectId: string,
	soundingId: string,
	page: ReadingsPage = { offset: 0, limit: READINGS_PER_SOUNDING_MAX },
	url?: URL,
	db: DbOrTx = getDb()
): SoundingDetailView {
	const detail = getSounding(projectId, soundingId, db);
	const derived = deriveSounding(projectId, detail.id, db);
	const { columns: _columns, ...sounding } = detail;
	return {
		sounding,
		groundwater: { elevation: derived.sounding.groundwaterElevation, source: derived.sounding.groundwaterSource },
		...readingsPageJson(detail, derived, page, url),
		units: derived.units,
		warnings: derived.warnings
	};
}

/**
 * Deletes a sounding (its contacts go with it, ON DELETE CASCADE). When it was the last sounding of its
 * source file, the stored file goes too, so the same file can be imported again. Interpolated contacts of
 * other soundings are brought up to date.
 * @throws ServiceError 404 when the sounding is not in the project.
 */
export function deleteSounding(projectId: string, soundingId: string, db: DbOrTx = getDb()): void {
	db.transaction((tx) => {
		const row = tx
			.select({ sourceFileId: soundings.sourceFileId, name: soundings.name })
			.from(soundings)
			.where(and(eq(soundings.projectId, projectId), eq(soundings.id, soundingId)))
			.get();
		if (!row) throw new ServiceError(404, 'Sounding not found.');
		tx.delete(soundings).where(eq(soundings.id, soundingId)).run();
		recordAudit(tx, { projectId, kind: 'sounding', action: 'deleted', subject: row.name, subjectId: soundingId, detail: 'with its readings and contacts' });
		if (row.sourceFileId) {
			const left = tx.select({ n: count() }).from(soundings).where(eq(soundings.sourceFileId, row.sourceFileId)).get()?.n ?? 0;
			if (left === 0) tx.delete(sourceFiles).where(eq(sourceFiles.id, row.sourceFileId)).run();
		}
		// Its neighbours' interpolated contacts may have leant on it.
		refreshInterpolatedContacts(projectId, tx);
	});
}
