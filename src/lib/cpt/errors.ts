import { MAX_FILE_BYTES } from './constants';

/** What went wrong in a CPT file, as a stable code for API responses and tests. */
export type CptParseErrorCode =
	| 'file-too-large'
	| 'empty-file'
	| 'binary-file'
	| 'malformed'
	| 'missing-column'
	| 'unknown-unit'
	| 'not-a-number'
	| 'missing-value'
	| 'depth-not-increasing'
	| 'not-a-cpt';

/** Where an error sits and what it is; `detail` is the message without its location prefix. */
export interface CptParseErrorInit {
	code: CptParseErrorCode;
	detail: string;
	file?: string;
	/** 1-based line number; absent for whole-file errors such as a size limit. */
	line?: number;
	/** The column as the file names it (a header, an AGS heading, or a GEF quantity). */
	column?: string;
}

/**
 * The one error type every CPT parser throws for bad input. Its message reads
 * "soundings.csv: line 17, column qc: 'abc' is not a number"; the parts are also fields.
 */
export class CptParseError extends Error {
	readonly code: CptParseErrorCode;
	readonly detail: string;
	readonly file?: string;
	readonly line?: number;
	readonly column?: string;

	constructor(init: CptParseErrorInit) {
		super(formatMessage(init));
		this.name = 'CptParseError';
		this.code = init.code;
		this.detail = init.detail;
		this.file = init.file;
		this.line = init.line;
		this.column = init.column;
	}
}

function formatMessage({ file, line, column, detail }: CptParseErrorInit): string {
	const where: string[] = [];
	if (line !== undefined) where.push(`line ${line}`);
	if (column !== undefined) where.push(`column ${column}`);
	const location = where.join(', ');
	const prefix = [file, location].filter((s) => s).join(': ');
	return prefix ? `${prefix}: ${detail}` : detail;
}

/**
 * Rejects a file larger than {@link MAX_FILE_BYTES} before it is decoded or parsed.
 * @throws CptParseError with code 'file-too-large'.
 */
export function assertFileSize(byteLength: number, file?: string): void {
	if (byteLength > MAX_FILE_BYTES) {
		const mb = (byteLength / (1024 * 1024)).toFixed(1);
		throw new CptParseError({
			code: 'file-too-large',
			file,
			detail: `file is ${mb} MB, over the ${MAX_FILE_BYTES / (1024 * 1024)} MB limit`
		});
	}
}
