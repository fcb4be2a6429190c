// Private helpers shared by the parsers; not part of the public API.
import { MAX_FILE_BYTES } from './constants';
import { CptParseError } from './errors';

/**
 * Size, emptiness and binary checks every parser runs first; returns the text without a byte-order mark.
 * A string longer than the byte limit is too large whatever its encoding (every UTF-16 unit takes ≥ 1 byte).
 */
export function prepareText(text: string, file: string | undefined): string {
	if (typeof text !== 'string') throw new TypeError('text must be a string');
	if (text.length > MAX_FILE_BYTES) {
		throw new CptParseError({ code: 'file-too-large', file, detail: `file is over the ${MAX_FILE_BYTES / (1024 * 1024)} MB limit` });
	}
	const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	if (body.trim() === '') throw new CptParseError({ code: 'empty-file', file, line: 1, detail: 'file is empty' });
	const nul = body.indexOf('\u0000');
	if (nul >= 0) {
		throw new CptParseError({ code: 'binary-file', file, line: lineOf(body, nul), detail: 'file is binary, not text' });
	}
	// Text decoded from binary is full of control characters and U+FFFD; a few stray ones are tolerated.
	const sample = Math.min(body.length, 65536);
	let odd = 0;
	let firstOdd = -1;
	for (let i = 0; i < sample; i++) {
		const c = body.charCodeAt(i);
		if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12 && c !== 11) || c === 0xfffd || (c >= 0x7f && c < 0xa0)) {
			odd++;
			if (firstOdd < 0) firstOdd = i;
		}
	}
	if (odd > 4 && odd > sample / 100) {
		throw new CptParseError({ code: 'binary-file', file, line: lineOf(body, firstOdd), detail: 'file is binary, not text' });
	}
	return body;
}

function lineOf(text: string, index: number): number {
	let line = 1;
	for (let i = 0; i < index; i++) {
		const c = text.charCodeAt(i);
		if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) line++;
	}
	return line;
}

/** Lines without their terminators; CRLF, LF and lone CR all end a line. */
export function splitLines(text: string): string[] {
	return text.split(/\r\n|\n|\r/);
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A strictly numeric cell as a number, or undefined when the cell is not a plain decimal number. */
export function parseNumber(cell: string): number | undefined {
	const s = cell.trim();
	if (!NUMBER.test(s)) return undefined;
	const v = Number(s);
	return Number.isFinite(v) ? v : undefined;
}

/** Cells that mean "no reading" in exported tables. */
export function isMissingCell(cell: string): boolean {
	const s = cell.trim().toLowerCase();
	return s === '' || s === 'nan' || s === 'na' || s === 'n/a' || s === '-' || s === 'null';
}

/**
 * Splits one line of delimited text, honouring double quotes ("" inside quotes is a literal quote).
 * Returns undefined when a quote is left open.
 */
export function splitQuoted(line: string, delimiter: string): string[] | undefined {
	if (line.indexOf('"') < 0) return line.split(delimiter).map((f) => f.trim());
	const fields: string[] = [];
	let field = '';
	let i = 0;
	let quoted = false;
	let wasQuoted = false;
	while (i < line.length) {
		const ch = line[i];
		if (quoted) {
			if (ch === '"') {
				if (line[i + 1] === '"') {
					field += '"';
					i += 2;
					continue;
				}
				quoted = false;
				i++;
				continue;
			}
			field += ch;
			i++;
			continue;
		}
		if (ch === '"' && (field.trim() === '' && !wasQuoted)) {
			quoted = true;
			wasQuoted = true;
			field = '';
			i++;
			continue;
		}
		if (ch === delimiter) {
			fields.push(wasQuoted ? field : field.trim());
			field = '';
			wasQuoted = false;
			i++;
			continue;
		}
		if (!(wasQuoted && (ch === ' ' || ch === '\t'))) field += ch;
		i++;
	}
	if (quoted) return undefined;
	fields.push(wasQuoted ? field : field.trim());
	return fields;
}

/** An append-only Float64Array that doubles its capacity. */
export class Column {
	private data = new Float64Array(64);
	length = 0;

	push(v: number): void {
		if (this.length === this.data.length) {
			const next = new Float64Array(this.data.length * 2);
			next.set(this.data);
			this.data = next;
		}
		this.data[this.length++] = v;
	}

	last(): number {
		return this.length > 0 ? this.data[this.length - 1] : NaN;
	}

	toArray(): Float64Array {
		return this.data.slice(0, this.length);
	}
}

/** The file name without its folders and extension, as a fallback sounding id. */
export function stem(file: string | undefined): string | undefined {
	if (!file) return undefined;
	const base = file.split(/[\\/]/).pop() ?? file;
	const dot = base.lastIndexOf('.');
	const s = dot > 0 ? base.slice(0, dot) : base;
	return s.trim() || undefined;
}
