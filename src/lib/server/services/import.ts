import { createHash } from 'node:crypto';
import { and, count, eq, inArray } from 'drizzle-orm';
import {
	CptParseError,
	DEFAULT_AREA_RATIO,
	decodeCptText,
	detectFormat,
	parseAgs4,
	parseDelimited,
	parseAgs4Geology,
	parseGef,
	previewDelimited,
	type DelimitedMapping,
	type DelimitedPreview,
	type ParsedSounding
} from '$lib/cpt';
import { formatDateTime } from '$lib/dates';
import { getDb } from '$lib/server/db';
import { toFloat64Blob } from '$lib/server/db/float64';
import { soundings, sourceFiles, units, type SourceFormat } from '$lib/server/db/site-schema';
import { ServiceError, type ErrorStatus } from '$lib/server/errors';
import type { DbOrTx } from '$lib/server/db/transaction';
import { refreshInterpolatedContacts } from './contacts';
import { geologyOffer, writeGeologyContacts, type GeologyOffer, type GeologyRequest, type GeologySource, type WrittenSounding } from './import-geology';
import { planSoundings, type ClashResolution, type PlannedSounding } from './import-plan';

/** One uploaded file: its name as the user's computer gave it, and its bytes. */
export interface UploadedFile {
	name: string;
	bytes: Uint8Array;
}

/** Fallbacks for GEF and AGS4 files that do not state them (delimited text takes them from its mapping). */
export interface SoundingDefaults {
	groundElevation?: number;
	areaRatio?: number;
}

export interface ImportRequest {
	files: UploadedFile[];
	/** Column mapping for every delimited-text file of the upload … */
	mapping?: DelimitedMapping;
	/** … or one per file name, which takes precedence. */
	mappings?: Record<string, DelimitedMapping>;
	defaults?: SoundingDefaults;
	/** What to do with each sounding whose name is taken (see planSoundings); without one a clash refuses the upload. */
	clashes?: ClashResolution[];
	/** Write contacts from the AGS4 GEOL groups of the upload, mapping each key to a unit. */
	geology?: GeologyRequest;
}

/** What an upload will do, before anything is written: each sounding's fate, and the GEOL offer. */
export interface UploadPlan {
	soundings: PlannedSounding[];
	/** Clashes still waiting for a choice. */
	unresolved: number;
	/** Files refused as already imported (409); the rest of the plan stands without them. */
	problems: FileProblem[];
	geology: GeologyOffer | null;
}

/** Why one file was refused; `line` is 1-based, `column` as the file names it. */
export interface FileProblem {
	file: string;
	code: string;
	message: string;
	line?: number;
	column?: string;
}

/**
 * An upload refused as a whole: nothing from it is stored. The status is the most fundamental problem
 * among the files: 413 when a file is too large, else 422 for unreadable content, else 409 for files or
 * soundings already in the project.
 */
export class ImportRejected extends ServiceError {
	constructor(
		status: ErrorStatus,
		message: string,
		readonly problems: FileProblem[],
		/** The plan, when the files could be read and only clashes or re-imports stand in the way. */
		readonly plan?: UploadPlan
	) {
		super(status, message);
		this.name = 'ImportRejected';
	}
}

export interface ImportedFile {
	id: string;
	name: string;
	format: SourceFormat;
	/** Stored soundings; `action` 'replace' kept the project's sounding id, 'rename' stored it under a new name. */
	soundings: { id: string; name: string; readings: number; action: 'import' | 'replace' | 'rename'; originalName?: string; notes: string[] }[];
	/** Names of this file's soundings left out by a 'skip'. */
	skipped: string[];
}

export interface ImportResult {
	files: ImportedFile[];
	/** Contacts written from GEOL groups, when asked for. */
	geology?: { contacts: number; unitsCreated: string[] };
	/** Soundings without contacts of their own that took contacts interpolated from their neighbours. */
	interpolatedContacts: number;
}

export function sha256Hex(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

/**
 * The column-mapping step's view of a delimited file: header, first rows and a guessed mapping.
 * @throws ImportRejected (413 or 422) naming the file, line and column when the text cannot be previewed.
 */
export function previewUpload(file: UploadedFile, rows = 10): DelimitedPreview {
	try {
		return previewDelimited(decodeCptText(file.bytes, file.name), { file: file.name, rows });
	} catch (err) {
		const problem = problemOf(file.name, err);
		throw new ImportRejected(problem.code === 'file-too-large' ? 413 : 422, problem.message, [problem]);
	}
}

interface Prepared {
	file: UploadedFile;
	format: SourceFormat;
	sha256: string;
	soundings: ParsedSounding[];
	geology: GeologySource;
}

/**
 * Imports an upload of one or more files (CSV/TSV with a column mapping, GEF, AGS4) into a project,
 * all or nothing: every file is parsed and checked first, and only when all pass are the files (original
 * bytes and SHA-256) and their soundings written, in one transaction, with the contacts of AGS4 GEOL groups
 * when asked for. A file already imported (same SHA-256) is refused with 409; so is a sounding whose name is
 * taken, unless `clashes` says to skip it, replace the sounding of that name or keep both under a new name.
 *
 * @throws ImportRejected listing every refused file with its line and column (with the plan for a 409).
 */
export function importSoundings(projectId: string, userId: string | null, request: ImportRequest, db: DbOrTx = getDb()): ImportResult {
	const prepared = prepareAll(request);
	return db.transaction((tx) => {
		const plan = planOf(projectId, prepared, request, tx);
		if (plan.problems.length > 0 || plan.unresolved > 0) throw rejection([...plan.problems, ...clashProblems(plan)], request.files.length, plan);
		const geologyErrors = request.geology ? (plan.geology?.errors ?? []) : [];
		if (geologyErrors.length > 0) {
			throw rejection(geologyErrors.map((e) => ({ file: e.file, code: 'malformed', message: e.message })), request.files.length);
		}
		return writeImport(projectId, userId, prepared, plan, request, tx);
	});
}

/**
 * What {@link importSoundings} would do with the same request, writing nothing: each sounding's name and
 * action, clashes with a suggested new name, files already imported, and the GEOL offer.
 * @throws ImportRejected (413 or 422) when a file cannot be read.
 */
export function planImport(projectId: string, request: ImportRequest, db: DbOrTx = getDb()): UploadPlan {
	return planOf(projectId, prepareAll(request, true), request, db);
}

function prepareAll(request: ImportRequest, checking = false): Prepared[] {
	if (request.files.length === 0) throw new ImportRejected(422, 'Choose at least one file to import.', []);
	const problems: FileProblem[] = [];
	const prepared: Prepared[] = [];
	for (const file of request.files) {
		try {
			prepared.push(prepare(file, request));
		} catch (err) {
			problems.push(problemOf(file.name, err));
		}
	}
	if (problems.length > 0) throw rejection(problems, request.files.length, undefined, checking);
	return prepared;
}

function planOf(projectId: string, prepared: Prepared[], request: ImportRequest, db: DbOrTx): UploadPlan {
	const problems = alreadyImported(projectId, prepared, db);
	const refused = new Set(problems.map((p) => p.file));
	const kept = prepared.filter((p) => !refused.has(p.file.name));
	const soundings = planSoundings(projectId, kept.map((p) => ({ name: p.file.name, format: p.format, soundings: p.soundings })), request.clashes, db);
	const stored = new Map<string, ParsedSounding[]>();
	for (const p of kept) stored.set(p.file.name, p.soundings.filter((s) => soundings.some((q) => q.file === p.file.name && q.name === s.id && q.finalName !== null)));
	const unitNames = db.select({ name: units.name }).from(units).where(eq(units.projectId, projectId)).all().map((u) => u.name);
	const geology = geologyOffer(kept.map((p) => p.geology), stored, unitNames, request.geology);
	return { soundings, unresolved: soundings.filter((s) => s.action === 'unresolved').length, problems, geology };
}

function clashProblems(plan: UploadPlan): FileProblem[] {
	return plan.soundings
		.filter((s) => s.action === 'unresolved')
		.map((s) => ({ file: s.file, code: 'sounding-exists', message: `${s.file}: ${s.message}` }));
}

function writeImport(projectId: string, userId: string | null, prepared: Prepared[], plan: UploadPlan, request: ImportRequest, tx: DbOrTx): ImportResult {
	const written: WrittenSounding[] = [];
	const oldSources = new Set<string>();
	const files: ImportedFile[] = [];
	for (const p of prepared) {
		const fates = p.soundings.map((s) => ({ s, plan: plan.soundings.find((q) => q.file === p.file.name && q.name === s.id)! }));
		const kept = fates.filter((f) => f.plan.finalName !== null);
		const skipped = fates.filter((f) => f.plan.finalName === null).map((f) => f.s.id);
		// A file all of whose soundings are skipped is not kept: nothing of it was imported.
		if (kept.length === 0) continue;
		const row = tx
			.insert(sourceFiles)
			.values({
				projectId,
				name: p.file.name,
				format: p.format,
				sha256: p.sha256,
				size: p.file.bytes.byteLength,
				bytes: Buffer.from(p.file.bytes.buffer, p.file.bytes.byteOffset, p.file.bytes.byteLength),
				mapping: p.format === 'delimited' ? ({ ...mappingFor(p.file, request) } as Record<string, unknown>) : null,
				uploadedBy: userId
			})
			.returning({ id: sourceFiles.id })
			.get();
		const created = kept.map(({ s, plan: q }) => {
			const values = soundingRow(projectId, row.id, s, q.finalName!);
			let id: string;
			if (q.action === 'replace' && q.clash?.existing) {
				// In place: the sounding keeps its id, contacts and groundwater; the new createdAt renews derived caches.
				const { projectId: _p, groundwaterElevation: _g, ...fields } = values;
				tx.update(soundings).set({ ...fields, createdAt: new Date() }).where(eq(soundings.id, q.clash.existing.id)).run();
				if (q.clash.existing.sourceFileId) oldSources.add(q.clash.existing.sourceFileId);
				id = q.clash.existing.id;
			} else id = tx.insert(soundings).values(values).returning({ id: soundings.id }).get().id;
			written.push({ file: p.file.name, soundingId: id, sounding: s });
			const action = q.action as 'import' | 'replace' | 'rename';
			return { id, name: q.finalName!, readings: s.depth.length, action, ...(action === 'rename' ? { originalName: s.id } : {}), notes: q.notes };
		});
		files.push({ id: row.id, name: p.file.name, format: p.format, soundings: created, skipped });
	}
	for (const id of oldSources) {
		const left = tx.select({ n: count() }).from(soundings).where(eq(soundings.sourceFileId, id)).get()?.n ?? 0;
		if (left === 0) tx.delete(sourceFiles).where(eq(sourceFiles.id, id)).run();
	}
	const geology = request.geology ? writeGeologyContacts(projectId, prepared.map((p) => p.geology), written, request.geology, tx) : undefined;
	const interpolatedContacts = refreshInterpolatedContacts(projectId, tx);
	return { files, ...(geology ? { geology } : {}), interpolatedContacts };
}

function prepare(file: UploadedFile, request: ImportRequest): Prepared {
	const text = decodeCptText(file.bytes, file.name);
	const format = detectFormat(text, file.name);
	let parsed: ParsedSounding[];
	if (format === 'gef') parsed = parseGef(text, { file: file.name });
	else if (format === 'ags4') parsed = parseAgs4(text, { file: file.name });
	else {
		const mapping = mappingFor(file, request);
		if (!mapping) {
			throw new CptParseError({ code: 'missing-column', file: file.name, detail: 'delimited text needs a column mapping' });
		}
		parsed = parseDelimited(text, mapping, { file: file.name });
	}
	const defaults = request.defaults ?? {};
	for (const s of parsed) {
		if (s.groundElevation === undefined || !Number.isFinite(s.groundElevation)) {
			if (defaults.groundElevation === undefined) {
				throw new CptParseError({
					code: 'missing-value',
					file: file.name,
					column: format === 'gef' ? 'ZID' : format === 'ags4' ? 'LOCA_GL' : 'ground elevation',
					detail: `sounding ${s.id} has no ground elevation; enter one in the upload form`
				});
			}
			s.groundElevation = defaults.groundElevation;
		}
		if (s.areaRatio === undefined && defaults.areaRatio !== undefined) s.areaRatio = defaults.areaRatio;
		if (s.depth.length === 0) {
			throw new CptParseError({ code: 'malformed', file: file.name, detail: `sounding ${s.id} has no readings` });
		}
		if (!Number.isFinite(maxFinite(s.qc))) {
			throw new CptParseError({ code: 'missing-value', file: file.name, column: 'qc', detail: `sounding ${s.id} has no qc readings` });
		}
	}
	const geology: GeologySource = { file: file.name, layers: [] };
	if (format === 'ags4') {
		try {
			geology.layers = parseAgs4Geology(text, { file: file.name });
		} catch (err) {
			if (!(err instanceof CptParseError)) throw err;
			geology.error = err.message;
		}
	}
	return { file, format, sha256: sha256Hex(file.bytes), soundings: parsed, geology };
}

function mappingFor(file: UploadedFile, request: ImportRequest): DelimitedMapping | undefined {
	return request.mappings?.[file.name] ?? request.mapping;
}

/** Files already imported into the project, and the same bytes twice in the upload. */
function alreadyImported(projectId: string, prepared: Prepared[], db: DbOrTx): FileProblem[] {
	const problems: FileProblem[] = [];
	const shas = prepared.map((p) => p.sha256);
	const knownFiles = shas.length
		? db
				.select({ sha256: sourceFiles.sha256, name: sourceFiles.name, uploadedAt: sourceFiles.uploadedAt })
				.from(sourceFiles)
				.where(and(eq(sourceFiles.projectId, projectId), inArray(sourceFiles.sha256, shas)))
				.all()
		: [];
	const seenSha = new Map<string, string>();
	for (const p of prepared) {
		const file = p.file.name;
		const known = knownFiles.find((k) => k.sha256 === p.sha256);
		if (known) {
			problems.push({ file, code: 'already-imported', message: `${file}: already imported (as ${known.name}, ${formatDateTime(known.uploadedAt, { utc: true })})` });
			continue;
		}
		const twin = seenSha.get(p.sha256);
		if (twin) {
			problems.push({ file, code: 'already-imported', message: `${file}: the same file as ${twin} in this upload` });
			continue;
		}
		seenSha.set(p.sha256, file);
	}
	return problems;
}

function rejection(problems: FileProblem[], fileCount: number, plan?: UploadPlan, checking = false): ImportRejected {
	const codes = new Set(problems.map((p) => p.code));
	const status: ErrorStatus = codes.has('file-too-large')
		? 413
		: problems.some((p) => p.code !== 'already-imported' && p.code !== 'sounding-exists')
			? 422
			: 409;
	const refused = new Set(problems.map((p) => p.file)).size;
	const outcome = checking ? 'nothing can be imported until this is fixed' : 'nothing was imported';
	const message =
		fileCount === 1
			? `${problems[0].message}. ${outcome[0].toUpperCase()}${outcome.slice(1)}.`
			: `${refused} of ${fileCount} files were refused; ${outcome}.`;
	return new ImportRejected(status, message, problems, plan);
}

function problemOf(file: string, err: unknown): FileProblem {
	if (err instanceof CptParseError) {
		return { file, code: err.code, message: err.message, ...(err.line !== undefined ? { line: err.line } : {}), ...(err.column !== undefined ? { column: err.column } : {}) };
	}
	// Parsers throw CptParseError for bad content; anything else is a bug, reported without internals.
	console.error('[import]', file, err);
	return { file, code: 'internal', message: `${file}: could not be read (an error on our side)` };
}

function soundingRow(projectId: string, sourceFileId: string, s: ParsedSounding, name: string): typeof soundings.$inferInsert {
	const extras: Record<string, string> = {};
	for (const [name, values] of Object.entries(s.extra ?? {})) extras[name] = toFloat64Blob(values).toString('base64');
	const finite = (v: number | undefined) => (v !== undefined && Number.isFinite(v) ? v : null);
	return {
		projectId,
		sourceFileId,
		name,
		x: finite(s.x),
		y: finite(s.y),
		chainage: finite(s.chainage),
		groundElevation: s.groundElevation!,
		areaRatio: s.areaRatio ?? DEFAULT_AREA_RATIO,
		readings: s.depth.length,
		maxDepth: maxFinite(s.depth),
		maxQc: maxFinite(s.qc),
		depth: toFloat64Blob(s.depth),
		qc: toFloat64Blob(s.qc),
		fs: toFloat64Blob(s.fs),
		u2: s.u2 ? toFloat64Blob(s.u2) : null,
		extras: Object.keys(extras).length > 0 ? extras : null
	};
}

function maxFinite(values: ArrayLike<number>): number {
	let m = -Infinity;
	for (let i = 0; i < values.length; i++) if (values[i] > m) m = values[i];
	return m;
}
