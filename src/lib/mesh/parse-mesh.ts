import { CptParseError } from '../cpt/errors';
import { Column, isMissingCell, splitQuoted } from '../cpt/text';
import { locateHeader, parseCell, trimTrailing, type Delimiter } from '../cpt/delimitedText';
import { COORDINATE_LIMIT, ELEVATION_LIMIT } from '../schemas/bounds';

/** Most elements of an uploaded mesh. */
export const MESH_ELEMENTS_MAX = 2_000_000;
/** Largest mesh file: 2 000 000 elements of an id, three coordinates and a group fit in it. */
export const MESH_FILE_BYTES_MAX = 160 * 1024 * 1024;
/** Longest element id or group label. */
export const MESH_LABEL_MAX = 64;

/** Which column holds what: headers as the file names them. */
export interface MeshMapping {
	delimiter?: Delimiter;
	/** The element id (any text, unique in the file). */
	id: string;
	/** x: the chainage of a 2D section, the easting in 3D. */
	x: string;
	/** The northing (3D only). */
	y?: string;
	/** The centroid's elevation. */
	z: string;
	/** An element group or material label, optional. */
	group?: string;
}

/** A mesh's element centroids, as columns. */
export interface ParsedMesh {
	ids: string[];
	x: Float64Array;
	/** Northings in 3D; null for a 2D section. */
	y: Float64Array | null;
	z: Float64Array;
	/** Each element's group label, or null without a group column. */
	group: string[] | null;
}

/**
 * Reads a CSV (or semicolon- or tab-delimited) file of element centroids: a header row, then one element a row.
 * Columns are picked by `mapping`; blank lines are skipped; numbers are plain decimals (a decimal comma with a
 * semicolon or tab delimiter). Refuses, naming the file, line and column: a missing mapped column, a row with a
 * missing or non-numeric coordinate, an id or group that is empty or over 64 characters, a duplicate id, a
 * coordinate beyond ±1e8 or an elevation beyond ±30 000 (the sane bounds of $lib/schemas/bounds), more than
 * `maxElements` elements, and a file without any. Lines are scanned in place, so a file of 2 000 000 rows is
 * never split into an array of lines. Pure; does not mutate its input.
 * @throws CptParseError (the import's one error type: file, line, column, detail)
 */
export function parseMeshCsv(
	text: string,
	mapping: MeshMapping,
	{ file, geometry, maxElements = MESH_ELEMENTS_MAX }: { file?: string; geometry: '2d' | '3d'; maxElements?: number }
): ParsedMesh {
	if (text.length > MESH_FILE_BYTES_MAX) throw new CptParseError({ code: 'file-too-large', file, detail: `file is over the ${MESH_FILE_BYTES_MAX / (1024 * 1024)} MB limit` });
	const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	if (body.trim() === '') throw new CptParseError({ code: 'empty-file', file, line: 1, detail: 'file is empty' });
	if (body.indexOf('\u0000') >= 0) throw new CptParseError({ code: 'binary-file', file, detail: 'file is binary, not text' });

	// The header is found among the first lines only; the rows are then scanned one at a time.
	const lines = new LineScanner(body);
	const head: string[] = [];
	for (let i = 0; i < 5 && !lines.done(); i++) head.push(lines.next());
	const { header, delimiter } = locateHeader(head, file, mapping.delimiter);
	const headers = splitQuoted(head[header], delimiter);
	if (!headers) throw new CptParseError({ code: 'malformed', file, line: header + 1, detail: 'a quoted field is not closed' });
	trimTrailing(headers, 0);
	const col = (name: string | undefined, what: string, required: boolean): number => {
		if (name === undefined) {
			if (required) throw new CptParseError({ code: 'missing-column', file, line: header + 1, detail: `no column is mapped to the ${what}` });
			return -1;
		}
		const k = headers.indexOf(name);
		if (k < 0) throw new CptParseError({ code: 'missing-column', file, line: header + 1, column: name, detail: `the ${what} column is not in the header` });
		return k;
	};
	const kId = col(mapping.id, 'element id', true);
	const kx = col(mapping.x, geometry === '2d' ? 'chainage' : 'easting', true);
	const ky = geometry === '3d' ? col(mapping.y, 'northing', true) : -1;
	const kz = col(mapping.z, 'elevation', true);
	const kg = col(mapping.group, 'group', false);

	const ids: string[] = [];
	const x = new Column();
	const y = new Column();
	const z = new Column();
	const group: string[] | null = kg >= 0 ? [] : null;
	// Duplicate ids are looked for at the end: numerically when every id is a plain whole number (a sort of
	// numbers is many times faster than a set of two million strings), else with a set.
	const numericIds = new Column();
	const lineOf = new Column();
	let allNumeric = true;
	const rest = head.slice(header + 1);
	let lineNo = header + 1;
	const row = (line: string) => {
		lineNo++;
		if (line.trim() === '') return;
		const fields = splitQuoted(line, delimiter);
		if (!fields) throw new CptParseError({ code: 'malformed', file, line: lineNo, detail: 'a quoted field is not closed' });
		if (ids.length >= maxElements) throw new CptParseError({ code: 'malformed', file, line: lineNo, detail: `the mesh has more than ${maxElements.toLocaleString('en-US')} elements` });
		const label = (k: number, what: string): string => {
			const v = (fields[k] ?? '').trim();
			if (v === '') throw new CptParseError({ code: 'missing-value', file, line: lineNo, column: headers[k], detail: `the ${what} is missing` });
			if (v.length > MESH_LABEL_MAX) throw new CptParseError({ code: 'malformed', file, line: lineNo, column: headers[k], detail: `the ${what} is longer than ${MESH_LABEL_MAX} characters` });
			return v;
		};
		const number = (k: number, what: string, limit: number): number => {
			const cell = fields[k] ?? '';
			if (isMissingCell(cell)) throw new CptParseError({ code: 'missing-value', file, line: lineNo, column: headers[k], detail: `the ${what} is missing` });
			const v = parseCell(cell, delimiter);
			if (v === undefined) throw new CptParseError({ code: 'not-a-number', file, line: lineNo, column: headers[k], detail: `'${cell.trim().slice(0, 40)}' is not a number` });
			if (Math.abs(v) > limit) throw new CptParseError({ code: 'malformed', file, line: lineNo, column: headers[k], detail: `${what} ${v} is outside ±${limit.toLocaleString('en-US')}` });
			return v;
		};
		const id = label(kId, 'element id');
		if (allNumeric && WHOLE.test(id)) numericIds.push(Number(id));
		else allNumeric = false;
		ids.push(id);
		lineOf.push(lineNo);
		x.push(number(kx, geometry === '2d' ? 'chainage' : 'easting', COORDINATE_LIMIT));
		if (ky >= 0) y.push(number(ky, 'northing', COORDINATE_LIMIT));
		z.push(number(kz, 'elevation', ELEVATION_LIMIT));
		if (group) group.push(label(kg, 'group'));
	};
	for (const line of rest) row(line);
	while (!lines.done()) row(lines.next());
	if (ids.length === 0) throw new CptParseError({ code: 'missing-value', file, line: header + 2, detail: 'the file lists no elements' });
	const twice = duplicateAt(ids, allNumeric ? numericIds.toArray() : null);
	if (twice >= 0) throw new CptParseError({ code: 'malformed', file, line: lineOf.toArray()[twice], column: headers[kId], detail: `element ${ids[twice]} appears twice` });
	return { ids, x: x.toArray(), y: ky >= 0 ? y.toArray() : null, z: z.toArray(), group };
}

/** A whole number written without leading zeros, exactly representable as a double. */
const WHOLE = /^(?:0|[1-9]\d{0,14})$/;

/** The index of the first id that repeats an earlier one (by position in the file), or −1. */
function duplicateAt(ids: string[], numeric: Float64Array | null): number {
	if (numeric) {
		const sorted = numeric.slice().sort();
		let repeated = NaN;
		for (let i = 1; i < sorted.length && Number.isNaN(repeated); i++) if (sorted[i] === sorted[i - 1]) repeated = sorted[i];
		if (Number.isNaN(repeated)) return -1;
		let first = true;
		for (let i = 0; i < numeric.length; i++) {
			if (numeric[i] !== repeated) continue;
			if (!first) return i;
			first = false;
		}
		return -1;
	}
	const seen = new Set<string>();
	for (let i = 0; i < ids.length; i++) {
		if (seen.has(ids[i])) return i;
		seen.add(ids[i]);
	}
	return -1;
}

/** Lines of a text one at a time (CRLF, LF or a lone CR end a line), without splitting the whole text. */
class LineScanner {
	private at = 0;
	constructor(private readonly text: string) {}
	done(): boolean {
		return this.at > this.text.length || (this.at === this.text.length && this.text.length > 0 && /[\r\n]$/.test(this.text));
	}
	next(): string {
		const t = this.text;
		let end = this.at;
		while (end < t.length) {
			const c = t.charCodeAt(end);
			if (c === 10 || c === 13) break;
			end++;
		}
		const line = t.slice(this.at, end);
		this.at = end < t.length && t.charCodeAt(end) === 13 && t.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
		return line;
	}
}
