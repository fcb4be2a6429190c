import { and, eq, inArray } from 'drizzle-orm';
import { DEFAULT_AREA_RATIO, decodeCptText, previewDelimited, type DelimitedPreview, type ParsedSounding } from '$lib/cpt';
import { getDb } from '$lib/server/db';
import { toFloat64Blob } from '$lib/server/db/float64';
import { soundings, sourceFiles, type SourceFormat } from '$lib/server/db/site-schema';
import { ServiceError, type ErrorStatus } from '$lib/server/errors';
import { mappingFor, maxFinite, parseUpload, problemOf, type FileProblem, type ImportRequest, type ParsedUpload, type UploadedFile } from './import-parse';
import type { DbOrTx } from './site';

export { sha256Hex, type FileProblem, type ImportRequest, type SoundingDefaults, type UploadedFile } from './import-parse';

/**
 * An upload refused as a whole: nothing from it is stored. The status is the most fundamental problem
 * among the files: 413 when a file or a sounding is too large, else 422 for unreadable content, else 409 for
 * files or soundings already in the project.
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
 * SHA-256) or a sounding whose name is taken is refused with 409. Parses in the calling thread; uploads
 * use `importSoundingsOffThread`.
 *
 * @throws ImportRejected listing every refused file with its line and column.
 */
export function importSoundings(projectId: string, userId: string | null, request: ImportRequest, db: DbOrTx = getDb()): ImportResult {
	if (request.files.length === 0) throw new ImportRejected(422, 'Choose at least one file to import.', []);
	return commitImport(projectId, userId, request, parseUpload(request), db);
}

/**
 * `importSoundings` with the parsing (decoding, parsing, checking, hashing: nearly all of an import's time) in
 * a worker thread, so the server keeps answering other requests during a large upload. Only the conflict check
 * and the one transaction run on the request's thread.
 */
export async function importSoundingsOffThread(projectId: string, userId: string | null, request: ImportRequest, db: DbOrTx = getDb()): Promise<ImportResult> {
	if (request.files.length === 0) throw new ImportRejected(422, 'Choose at least one file to import.', []);
	// Loaded on first use, so scripts that run this module under tsx (no Vite plugins) can import it.
	const { parseUploadOffThread } = await import('./import-thread');
	return commitImport(projectId, userId, request, await parseUploadOffThread(request), db);
}

function commitImport(projectId: string, userId: string | null, request: ImportRequest, { parsed, problems: parseProblems }: ParsedUpload, db: DbOrTx): ImportResult {
	const prepared: Prepared[] = parsed.map(({ index, ...p }) => ({ file: request.files[index], ...p }));
	const problems: FileProblem[] = [...parseProblems];
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
	const status: ErrorStatus = codes.has('file-too-large') || codes.has('too-many-readings')
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
