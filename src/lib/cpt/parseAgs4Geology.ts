import { CptParseError } from './errors';
import type { CptParseErrorCode } from './errors';
import type { ParseOptions } from './types';
import { lengthUnitFactor } from './units';
import { parseNumber, prepareText, splitLines, splitQuoted } from './text';

/*
 * The AGS4 GEOL group, the stratum log of each location (from memory of the AGS4 data dictionary, see
 * /work/shared/REFERENCES.md): LOCA_ID, GEOL_TOP and GEOL_BASE (depths below ground, m), GEOL_DESC (the
 * description) and GEOL_GEOL (a geology code). Other groups are skipped here; parseAgs4 reads the CPT groups.
 */

/** One stratum of a location's log, depths in m below ground. */
export interface Ags4GeologyLayer {
	locaId: string;
	/** Depth of the stratum's top (m). */
	top: number;
	/** Depth of its base (m); NaN when the file leaves it blank. */
	base: number;
	/** GEOL_GEOL, '' when absent or blank. */
	code: string;
	/** GEOL_DESC, '' when absent or blank. */
	description: string;
	/** 1-based line of the DATA row. */
	line: number;
}

/**
 * Reads the GEOL group of an AGS4 file: one layer per DATA row, in file order, depths converted to metres from
 * the UNIT row (m, cm, mm, ft; blank means m). A file without a GEOL group gives an empty array.
 *
 * @throws CptParseError naming the line and heading of a row that cannot be read: a missing LOCA_ID or
 *   GEOL_TOP heading, an empty LOCA_ID, a top that is not a non-negative number, a base above the top.
 */
export function parseAgs4Geology(text: string, options: ParseOptions = {}): Ags4GeologyLayer[] {
	const { file } = options;
	const fail = (code: CptParseErrorCode, line: number | undefined, detail: string, column?: string): never => {
		throw new CptParseError({ code, file, line, column, detail });
	};
	const lines = splitLines(prepareText(text, file));
	const layers: Ags4GeologyLayer[] = [];
	let inGeol = false;
	let headings: string[] | undefined;
	let headingLine = 0;
	let units: string[] | undefined;
	let cols: { id: number; top: number; base: number; code: number; desc: number; fTop: number; fBase: number } | undefined;

	for (let i = 0; i < lines.length; i++) {
		const lineNo = i + 1;
		if (lines[i].trim() === '') continue;
		const row = splitQuoted(lines[i], ',');
		if (!row) fail('malformed', lineNo, 'a quoted field is not closed');
		const descriptor = row![0].toUpperCase();
		const fields = row!.slice(1);
		if (descriptor === 'GROUP') {
			inGeol = (fields[0] ?? '').toUpperCase() === 'GEOL';
			headings = undefined;
			units = undefined;
			cols = undefined;
			continue;
		}
		if (!inGeol) continue;
		if (descriptor === 'HEADING') {
			headings = fields.map((f) => f.toUpperCase());
			headingLine = lineNo;
		} else if (descriptor === 'UNIT') units = fields;
		else if (descriptor === 'DATA') {
			if (!headings) fail('malformed', lineNo, 'DATA row before HEADING');
			if (!cols) cols = columnsOf(headings!, units, headingLine, fail);
			if (fields.length !== headings!.length) fail('malformed', lineNo, `expected ${headings!.length} fields after DATA, found ${fields.length}`);
			const locaId = fields[cols.id].trim();
			if (locaId === '') fail('missing-value', lineNo, 'LOCA_ID is empty', 'LOCA_ID');
			const depth = (k: number, f: number, name: string): number => {
				if (k < 0 || fields[k].trim() === '') return NaN;
				const v = parseNumber(fields[k]);
				if (v === undefined) fail('not-a-number', lineNo, `'${fields[k]}' is not a number`, name);
				return (v as number) * f;
			};
			const top = depth(cols.top, cols.fTop, 'GEOL_TOP');
			if (!(top >= 0)) fail(Number.isNaN(top) ? 'missing-value' : 'malformed', lineNo, Number.isNaN(top) ? 'GEOL_TOP is empty' : `top ${top} m is negative`, 'GEOL_TOP');
			const base = depth(cols.base, cols.fBase, 'GEOL_BASE');
			if (base < top) fail('malformed', lineNo, `base ${base} m is above the top ${top} m`, 'GEOL_BASE');
			layers.push({
				locaId,
				top,
				base,
				code: cols.code >= 0 ? fields[cols.code].trim() : '',
				description: cols.desc >= 0 ? fields[cols.desc].trim() : '',
				line: lineNo
			});
		}
	}
	return layers;
}

function columnsOf(
	headings: string[],
	units: string[] | undefined,
	headingLine: number,
	fail: (code: CptParseErrorCode, line: number | undefined, detail: string, column?: string) => never
) {
	const k = (name: string) => headings.indexOf(name);
	const need = (name: string) => {
		const i = k(name);
		if (i < 0) fail('missing-column', headingLine, `group GEOL has no heading ${name}`, name);
		return i;
	};
	const factor = (i: number): number => {
		const unit = i >= 0 && units ? (units[i] ?? '') : '';
		if (unit.trim() === '') return 1;
		const f = lengthUnitFactor(unit);
		if (f === undefined) fail('unknown-unit', headingLine, `unknown length unit '${unit}'`, headings[i]);
		return f as number;
	};
	const id = need('LOCA_ID');
	const top = need('GEOL_TOP');
	const base = k('GEOL_BASE');
	return { id, top, base, code: k('GEOL_GEOL'), desc: k('GEOL_DESC'), fTop: factor(top), fBase: factor(base) };
}
