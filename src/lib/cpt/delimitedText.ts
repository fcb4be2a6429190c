// Private helpers shared by parseDelimited and previewDelimited; not part of the public API.
import { CptParseError } from './errors';
import { parseNumber, splitQuoted } from './text';

/** The delimiters delimited text may use. */
export type Delimiter = ',' | ';' | '\t';
export const DELIMITERS: Delimiter[] = [',', ';', '\t'];

/**
 * The header line and delimiter of delimited text. A spreadsheet's "sep=;" first line names the delimiter
 * and is skipped; otherwise the header is the first non-blank line and the delimiter is detected.
 */
export function locateHeader(lines: string[], file: string | undefined, given?: Delimiter): { header: number; delimiter: Delimiter } {
	let header = 0;
	while (header < lines.length && lines[header].trim() === '') header++;
	const sep = /^\s*sep=(.)\s*$/i.exec(lines[header] ?? '');
	let named: Delimiter | undefined;
	if (sep) {
		named = DELIMITERS.find((d) => d === sep[1]);
		const sepLine = header + 1;
		header++;
		while (header < lines.length && lines[header].trim() === '') header++;
		if (header >= lines.length) throw new CptParseError({ code: 'malformed', file, line: sepLine, detail: 'no header after the sep= line' });
	}
	return { header, delimiter: given ?? named ?? detectDelimiter(lines, header, file) };
}

/**
 * The delimiter that splits the header into the most fields and keeps that field count on most of the
 * following lines; a semicolon file with decimal commas thus keeps ';' because its header has no commas.
 */
export function detectDelimiter(lines: string[], header: number, file: string | undefined): Delimiter {
	let best: Delimiter | undefined;
	let bestScore = -1;
	let bestCount = 0;
	for (const d of DELIMITERS) {
		const head = splitQuoted(lines[header], d);
		if (!head || head.length < 2) continue;
		let checked = 0;
		let same = 0;
		for (let i = header + 1; i < lines.length && checked < 20; i++) {
			if (lines[i].trim() === '') continue;
			checked++;
			const f = splitQuoted(lines[i], d);
			if (f && trimTrailing(f, head.length).length === head.length) same++;
		}
		const score = checked === 0 ? 1 : same / checked;
		if (score > bestScore || (score === bestScore && head.length > bestCount)) {
			best = d;
			bestScore = score;
			bestCount = head.length;
		}
	}
	if (!best) {
		throw new CptParseError({ code: 'malformed', file, line: header + 1, detail: 'no comma, semicolon or tab separates the header' });
	}
	return best;
}

/** Drops empty fields beyond `count` (a trailing delimiter), leaving other rows as they are. */
export function trimTrailing(fields: string[], count: number): string[] {
	while (fields.length > count && fields[fields.length - 1] === '') fields.pop();
	return fields;
}

/**
 * A numeric cell; with a semicolon or tab delimiter a single decimal comma is accepted ("1,25").
 * Returns undefined for a non-numeric cell; the caller handles missing cells first.
 */
export function parseCell(cell: string, delimiter: Delimiter): number | undefined {
	const v = parseNumber(cell);
	if (v !== undefined || delimiter === ',') return v;
	const s = cell.trim();
	if (/^[+-]?\d*,\d+(?:[eE][+-]?\d+)?$/.test(s)) return parseNumber(s.replace(',', '.'));
	return undefined;
}
