import { createHash } from 'node:crypto';
import { and, eq, inArray } from 'drizzle-orm';
import {
	CptParseError,
	DEFAULT_AREA_RATIO,
	decodeCptText,
	detectFormat,
	parseAgs4,
	parseDelimited,
	parseGef,
	previewDelimited,
	type DelimitedMapping,
	type DelimitedPreview,
	type ParsedSounding
} from '$lib/cpt';
import { getDb } from '$lib/server/db';
import { toFloat64Blob } from '$lib/server/db/float64';
import { soundings, sourceFiles, type SourceFormat } from '$lib/server/db/site-schema';
import { ServiceError, type ErrorStatus } from '$lib/server/errors';
import type { DbOrTx } from '$lib/server/db/transaction';

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
		readonly problems: FileProblem[]
	) {
		super(status, message);
		this.name = 'ImportRejected';
	}
}

export interface ImportedFile {
	id: string;
	name: string;
	format: SourceFormat;
	soundings: { id: string; name: string; readings: number }[];
}

export interface ImportResult {
	files: ImportedFile[];
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
}

/**
 * Imports an upload of one or more files (CSV/TSV with a column mapping, GEF, AGS4) into a project,
 * all or nothing: every file is parsed and checked first, and only when all pass are the files (original
 * bytes and SHA-256) and their soundings written, in one transaction. A file already imported (same
 * SHA-256) or a sounding whose name is taken is refused with 409.
 *
 * @throws ImportRejected listing every refused file with its line and column.
 */
export function importSoundings(projectId: string, userId: string | null, request: ImportRequest, db: DbOrTx = getDb()): ImportResult {
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
	problems.push(...conflicts(projectId, prepared, db));
	if (problems.length > 0) throw rejection(problems, request.files.length);

	return db.transaction((tx) => {
		const files = prepared.map((p): ImportedFile => {
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
			const created = p.soundings.map((s) => {
				const stored = tx.insert(soundings).values(soundingRow(projectId, row.id, s)).returning({ id: soundings.id }).get();
				return { id: stored.id, name: s.id, readings: s.depth.length };
			});
			return { id: row.id, name: p.file.name, format: p.format, soundings: created };
		});
		return { files };
	});
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
	return { file, format, sha256: sha256Hex(file.bytes), soundings: parsed };
}

function mappingFor(file: UploadedFile, request: ImportRequest): DelimitedMapping | undefined {
	return request.mappings?.[file.name] ?? request.mapping;
}

/** Files already imported, soundings whose names are taken, and clashes inside the upload itself. */
function conflicts(projectId: string, prepared: Prepared[], db: DbOrTx): FileProblem[] {
	const problems: FileProblem[] = [];
	const shas = prepared.map((p) => p.sha256);
	const names = prepared.flatMap((p) => p.soundings.map((s) => s.id));
	const knownFiles = shas.length
		? db
				.select({ sha256: sourceFiles.sha256, name: sourceFiles.name, uploadedAt: sourceFiles.uploadedAt })
				.from(sourceFiles)
				.where(and(eq(sourceFiles.projectId, projectId), inArray(sourceFiles.sha256, shas)))
				.all()
		: [];
	const knownNames = new Set(
		names.length
			? db
					.select({ name: soundings.name })
					.from(soundings)
					.where(and(eq(soundings.projectId, projectId), inArray(soundings.name, names)))
					.all()
					.map((r) => r.name)
			: []
	);
	const seenSha = new Map<string, string>();
	const seenName = new Map<string, string>();
	for (const p of prepared) {
		const file = p.file.name;
		const known = knownFiles.find((k) => k.sha256 === p.sha256);
		if (known) {
			const when = known.uploadedAt.toISOString().slice(0, 16).replace('T', ' ');
			problems.push({ file, code: 'already-imported', message: `${file}: already imported (as ${known.name}, ${when} UTC)` });
			continue;
		}
		const twin = seenSha.get(p.sha256);
		if (twin) {
			problems.push({ file, code: 'already-imported', message: `${file}: the same file as ${twin} in this upload` });
			continue;
		}
		seenSha.set(p.sha256, file);
		for (const s of p.soundings) {
			if (knownNames.has(s.id)) {
				problems.push({ file, code: 'sounding-exists', message: `${file}: sounding ${s.id} is already in the project; delete it first to replace it` });
			} else if (seenName.has(s.id)) {
				problems.push({ file, code: 'sounding-exists', message: `${file}: sounding ${s.id} is also in ${seenName.get(s.id)} in this upload` });
			} else seenName.set(s.id, file);
		}
	}
	return problems;
}

function rejection(problems: FileProblem[], fileCount: number): ImportRejected {
	const codes = new Set(problems.map((p) => p.code));
	const status: ErrorStatus = codes.has('file-too-large')
		? 413
		: problems.some((p) => p.code !== 'already-imported' && p.code !== 'sounding-exists')
			? 422
			: 409;
	const refused = new Set(problems.map((p) => p.file)).size;
	const message =
		fileCount === 1
			? `${problems[0].message}. Nothing was imported.`
			: `${refused} of ${fileCount} files were refused; nothing was imported.`;
	return new ImportRejected(status, message, problems);
}

function problemOf(file: string, err: unknown): FileProblem {
	if (err instanceof CptParseError) {
		return { file, code: err.code, message: err.message, ...(err.line !== undefined ? { line: err.line } : {}), ...(err.column !== undefined ? { column: err.column } : {}) };
	}
	// Parsers throw CptParseError for bad content; anything else is a bug, reported without internals.
	console.error('[import]', file, err);
	return { file, code: 'internal', message: `${file}: could not be read (an error on our side)` };
}

function soundingRow(projectId: string, sourceFileId: string, s: ParsedSounding): typeof soundings.$inferInsert {
	const extras: Record<string, string> = {};
	for (const [name, values] of Object.entries(s.extra ?? {})) extras[name] = toFloat64Blob(values).toString('base64');
	const finite = (v: number | undefined) => (v !== undefined && Number.isFinite(v) ? v : null);
	return {
		projectId,
		sourceFileId,
		name: s.id,
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
