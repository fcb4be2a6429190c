/**
 * The pure half of an import: decode, detect, parse and check every file of an upload, without touching the
 * database. It runs in a worker thread for uploads (import.worker.ts), so a large file does not hold up other
 * requests, and in the calling thread for the demo seed and the tests. Relative imports only: the worker loads
 * this file without the app's path aliases.
 */
import { createHash } from 'node:crypto';
import {
	CptParseError,
	decodeCptText,
	detectFormat,
	parseAgs4,
	parseAgs4Geology,
	parseDelimited,
	parseGef,
	type Ags4GeologyLayer,
	type DelimitedMapping,
	type ParsedSounding
} from '../../cpt';
import { hasVisibleCharacter } from '../../schemas/common';
import { COORDINATE_LIMIT, DEPTH_LIMIT_M, ELEVATION_LIMIT, READINGS_PER_SOUNDING_MAX, SOUNDING_NAME_MAX } from '../../schemas/bounds';
import type { SourceFormat } from '../db/site-schema';

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

/** What parsing an upload needs: the files, their column mappings and fallbacks. */
export interface ParseRequest {
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
 * A file that parsed and passed every check: its place in the upload, format, SHA-256, soundings, and the
 * stratum log of an AGS4 file (GEOL group; `error` when the group is there but cannot be read).
 */
export interface ParsedFile {
	index: number;
	format: SourceFormat;
	sha256: string;
	soundings: ParsedSounding[];
	geology: { layers: Ags4GeologyLayer[]; error?: string };
}

export interface ParsedUpload {
	parsed: ParsedFile[];
	problems: FileProblem[];
}

export function sha256Hex(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

/** Parses and checks every file of an upload; a file either parses whole or gives one problem. */
export function parseUpload(request: ParseRequest): ParsedUpload {
	const parsed: ParsedFile[] = [];
	const problems: FileProblem[] = [];
	request.files.forEach((file, index) => {
		try {
			parsed.push({ index, ...parseFile(file, request) });
		} catch (err) {
			problems.push(problemOf(file.name, err));
		}
	});
	return { parsed, problems };
}

/** The mapping for a delimited file: its own (an own property of `mappings`, never an inherited member) or the upload's. */
export function mappingFor(file: UploadedFile, request: Pick<ParseRequest, 'mapping' | 'mappings'>): DelimitedMapping | undefined {
	const own = request.mappings && Object.hasOwn(request.mappings, file.name) ? request.mappings[file.name] : undefined;
	return own ?? request.mapping;
}

function parseFile(file: UploadedFile, request: ParseRequest): Omit<ParsedFile, 'index'> {
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
		checkSounding(s, file.name);
	}
	const geology: ParsedFile['geology'] = { layers: [] };
	if (format === 'ags4') {
		try {
			geology.layers = parseAgs4Geology(text, { file: file.name });
		} catch (err) {
			if (!(err instanceof CptParseError)) throw err;
			geology.error = err.message;
		}
	}
	return { format, sha256: sha256Hex(file.bytes), soundings: parsed, geology };
}

/** A parsed sounding beyond the limits of src/lib/schemas/bounds.ts; messages read like CptParseError's. */
export class SoundingLimitError extends Error {
	constructor(
		readonly code: 'too-many-readings' | 'name-too-long' | 'no-visible-name' | 'out-of-bounds',
		readonly file: string,
		readonly detail: string,
		readonly column?: string
	) {
		super(`${file}: ${column ? `column ${column}: ` : ''}${detail}`);
		this.name = 'SoundingLimitError';
	}
}

/**
 * The limits of src/lib/schemas/bounds.ts for a parsed sounding: its name, how many readings, where it is.
 * @throws SoundingLimitError `too-many-readings` (the upload answers 413), else 422
 */
function checkSounding(s: ParsedSounding, file: string): void {
	const name = s.id.length > 40 ? `${s.id.slice(0, 40)}…` : s.id;
	if (s.id.length > SOUNDING_NAME_MAX) {
		throw new SoundingLimitError('name-too-long', file, `sounding name ${name} has ${s.id.length} characters; the limit is ${SOUNDING_NAME_MAX}`);
	}
	if (!hasVisibleCharacter(s.id)) {
		throw new SoundingLimitError('no-visible-name', file, `a sounding name has no visible character (${JSON.stringify(s.id)})`);
	}
	if (s.depth.length > READINGS_PER_SOUNDING_MAX) {
		const count = s.depth.length.toLocaleString('en-US');
		throw new SoundingLimitError('too-many-readings', file, `sounding ${name} has ${count} readings; the limit is ${READINGS_PER_SOUNDING_MAX.toLocaleString('en-US')} per sounding`);
	}
	const outside = (value: number | undefined, limit: number, what: string, column: string) => {
		if (value !== undefined && Number.isFinite(value) && Math.abs(value) > limit) {
			throw new SoundingLimitError('out-of-bounds', file, `sounding ${name}: ${what} ${value} is outside ±${limit.toLocaleString('en-US')}`, column);
		}
	};
	outside(s.x, COORDINATE_LIMIT, 'easting', 'x');
	outside(s.y, COORDINATE_LIMIT, 'northing', 'y');
	outside(s.chainage, COORDINATE_LIMIT, 'chainage', 'chainage');
	outside(s.groundElevation, ELEVATION_LIMIT, 'ground elevation', 'ground elevation');
	const deepest = s.depth[s.depth.length - 1];
	if (deepest > DEPTH_LIMIT_M) {
		throw new SoundingLimitError('out-of-bounds', file, `sounding ${name}: depth ${deepest} m is beyond ${DEPTH_LIMIT_M.toLocaleString('en-US')} m`, 'depth');
	}
}

/** A file's problem for the refusal: a CptParseError as it is; anything else is a bug, reported without internals. */
export function problemOf(file: string, err: unknown): FileProblem {
	if (err instanceof CptParseError || err instanceof SoundingLimitError) {
		const line = err instanceof CptParseError ? err.line : undefined;
		return { file, code: err.code, message: err.message, ...(line !== undefined ? { line } : {}), ...(err.column !== undefined ? { column: err.column } : {}) };
	}
	console.error('[import]', file, err);
	return { file, code: 'internal', message: `${file}: could not be read (an error on our side)` };
}

export function maxFinite(values: ArrayLike<number>): number {
	let m = -Infinity;
	for (let i = 0; i < values.length; i++) if (values[i] > m) m = values[i];
	return m;
}
