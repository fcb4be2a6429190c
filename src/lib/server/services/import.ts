import { and, count, eq, inArray } from 'drizzle-orm';
import { DEFAULT_AREA_RATIO, decodeCptText, previewDelimited, type DelimitedPreview, type ParsedSounding } from '$lib/cpt';
import { formatDateTime } from '$lib/dates';
import { getDb } from '$lib/server/db';
import { toFloat64Blob } from '$lib/server/db/float64';
import { soundings, sourceFiles, units, type SourceFormat } from '$lib/server/db/site-schema';
import { ServiceError, type ErrorStatus } from '$lib/server/errors';
import type { DbOrTx } from '$lib/server/db/transaction';
import { refreshInterpolatedContacts } from './contacts';
import { geologyOffer, writeGeologyContacts, type GeologyOffer, type GeologyRequest, type GeologySource, type WrittenSounding } from './import-geology';
import { planSoundings, type ClashResolution, type PlannedSounding } from './import-plan';
import { mappingFor, maxFinite, parseUpload, problemOf, type FileProblem, type ParsedUpload, type ParseRequest, type UploadedFile } from './import-parse';
import { recordAudit } from './audit';

export { sha256Hex, type FileProblem, type SoundingDefaults, type UploadedFile } from './import-parse';

/** An upload: the files with their mapping and defaults (see ParseRequest), and what to do about clashes and GEOL logs. */
export interface ImportRequest extends ParseRequest {
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

/**
 * An upload refused as a whole: nothing from it is stored. The status is the most fundamental problem
 * among the files: 413 when a file or a sounding is too large, else 422 for unreadable content, else 409 for files or
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

/** Parses in the import worker (uploads); the demo seed and tests parse in their own thread. */
const offThread = async (request: ParseRequest): Promise<ParsedUpload> => {
	// Loaded on first use, so scripts that run this module under tsx (no Vite plugins) can import it.
	const { parseUploadOffThread } = await import('./import-thread');
	return parseUploadOffThread(request);
};

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
	return commitImport(projectId, userId, request, preparedOf(request, parseUpload(checkFiles(request))), db);
}

/**
 * {@link importSoundings} with the parsing (decoding, parsing, checking, hashing: nearly all of an import's
 * time) in a worker thread, so the server keeps answering other requests during a large upload. Only the
 * plan and the one transaction run on the request's thread.
 */
export async function importSoundingsOffThread(projectId: string, userId: string | null, request: ImportRequest, db: DbOrTx = getDb()): Promise<ImportResult> {
	const parsed = await offThread(checkFiles(request));
	return commitImport(projectId, userId, request, preparedOf(request, parsed), db);
}

function commitImport(projectId: string, userId: string | null, request: ImportRequest, prepared: Prepared[], db: DbOrTx): ImportResult {
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
	return planOf(projectId, preparedOf(request, parseUpload(checkFiles(request)), true), request, db);
}

/** {@link planImport} with the parsing in the import worker, as uploads are checked. */
export async function planImportOffThread(projectId: string, request: ImportRequest, db: DbOrTx = getDb()): Promise<UploadPlan> {
	const parsed = await offThread(checkFiles(request));
	return planOf(projectId, preparedOf(request, parsed, true), request, db);
}

function checkFiles<R extends ParseRequest>(request: R): R {
	if (request.files.length === 0) throw new ImportRejected(422, 'Choose at least one file to import.', []);
	return request;
}

/** The parsed files with their uploads; every problem refuses the upload as a whole. */
function preparedOf(request: ImportRequest, { parsed, problems }: ParsedUpload, checking = false): Prepared[] {
	if (problems.length > 0) throw rejection(problems, request.files.length, undefined, checking);
	return parsed.map(({ index, geology, ...p }) => ({ file: request.files[index], ...p, geology: { file: request.files[index].name, ...geology } }));
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
		const verbs = (a: string) => created.filter((c) => c.action === a).map((c) => (c.originalName ? `${c.originalName} as ${c.name}` : c.name));
		const detail = [
			['imported', verbs('import')],
			['replaced', verbs('replace')],
			['renamed', verbs('rename')],
			['skipped', skipped]
		]
			.filter(([, names]) => names.length)
			.map(([verb, names]) => `${verb} ${(names as string[]).join(', ')}`)
			.join('; ');
		recordAudit(tx, { projectId, kind: 'sounding', action: 'uploaded', subject: p.file.name, subjectId: row.id, detail: `${created.length} sounding${created.length === 1 ? '' : 's'}: ${detail}`, userId });
	}
	for (const id of oldSources) {
		const left = tx.select({ n: count() }).from(soundings).where(eq(soundings.sourceFileId, id)).get()?.n ?? 0;
		if (left === 0) tx.delete(sourceFiles).where(eq(sourceFiles.id, id)).run();
	}
	const geology = request.geology ? writeGeologyContacts(projectId, prepared.map((p) => p.geology), written, request.geology, tx) : undefined;
	const interpolatedContacts = refreshInterpolatedContacts(projectId, tx);
	return { files, ...(geology ? { geology } : {}), interpolatedContacts };
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
	const status: ErrorStatus = codes.has('file-too-large') || codes.has('too-many-readings')
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
