import { CptParseError } from './errors';
import type { CptParseErrorCode } from './errors';
import type { ParseOptions, ParsedSounding } from './types';
import { lengthUnitFactor, stressUnitFactor } from './units';
import { Column, parseNumber, prepareText, splitLines, splitQuoted } from './text';

/*
 * AGS4, the open AGS data-transfer format: quoted comma-separated rows whose first field is "GROUP",
 * "HEADING", "UNIT", "TYPE" or "DATA". Groups and headings read here, from memory of the AGS4 data
 * dictionary (see /work/shared/REFERENCES.md): LOCA (LOCA_ID, LOCA_NATE, LOCA_NATN, LOCA_GL),
 * SCPG (LOCA_ID, SCPG_TESN, SCPG_CAR) and SCPT (LOCA_ID, SCPG_TESN, SCPT_DPTH, SCPT_RES, SCPT_FRES, SCPT_PWP2).
 * Other groups and headings are skipped.
 */

interface Group {
	name: string;
	line: number;
	headings?: string[];
	headingLine?: number;
	units?: string[];
	/** SCPT column indices and unit factors, resolved at the group's first DATA row. */
	scpt?: { kId: number; kDepth: number; kQc: number; kFs: number; kT: number; kU2: number; fDepth: number; fQc: number; fFs: number; fU2: number };
}

interface Test {
	loca: string;
	tesn: string;
	depth: Column;
	qc: Column;
	fs: Column;
	u2: Column;
	hasU2: boolean;
}

/**
 * Parses an AGS4 file into its CPT soundings in SI units (m, kPa), one per LOCA_ID and SCPG_TESN, honouring
 * the UNIT row (MN/m2, MPa, kN/m2, kPa …; m or ft for lengths, which default to m when the unit is blank).
 * Locations and ground level come from LOCA, the cone area ratio from SCPG. A sounding's id is its LOCA_ID,
 * or "LOCA_ID/SCPG_TESN" when a location holds several tests. Empty cells become NaN.
 *
 * @throws CptParseError naming the line and heading of the first problem.
 */
export function parseAgs4(text: string, options: ParseOptions = {}): ParsedSounding[] {
	const { file } = options;
	const fail = (code: CptParseErrorCode, line: number | undefined, detail: string, column?: string): never => {
		throw new CptParseError({ code, file, line, column, detail });
	};
	const lines = splitLines(prepareText(text, file));

	const loca = new Map<string, { x?: number; y?: number; gl?: number }>();
	const car = new Map<string, number>();
	const tests = new Map<string, Test>();
	let projectId: string | undefined;
	let group: Group | undefined;
	let sawScpt = false;
	let first = true;

	const heading = (g: Group, name: string): number => g.headings!.indexOf(name);
	const need = (g: Group, name: string): number => {
		const k = heading(g, name);
		if (k < 0) fail('missing-column', g.headingLine, `group ${g.name} has no heading ${name}`, name);
		return k;
	};
	const unitOf = (g: Group, k: number): string => (g.units ? g.units[k] : '');
	const lengthFactor = (g: Group, k: number): number => {
		const unit = unitOf(g, k);
		if (unit.trim() === '') return 1;
		const f = lengthUnitFactor(unit);
		if (f === undefined) fail('unknown-unit', g.headingLine, `unknown length unit '${unit}'`, g.headings![k]);
		return f as number;
	};
	const stressFactor = (g: Group, k: number): number => {
		const unit = unitOf(g, k);
		if (!g.units) fail('malformed', g.headingLine, `group ${g.name} has no UNIT row`);
		const f = stressUnitFactor(unit);
		if (f === undefined) fail('unknown-unit', g.headingLine, unit.trim() === '' ? 'no unit given' : `unknown stress unit '${unit}'`, g.headings![k]);
		return f as number;
	};
	const cellNumber = (row: string[], k: number, lineNo: number, name: string): number => {
		if (k < 0) return NaN;
		const cell = row[k];
		if (cell.trim() === '') return NaN;
		const v = parseNumber(cell);
		if (v === undefined) fail('not-a-number', lineNo, `'${cell}' is not a number`, name);
		return v as number;
	};

	for (let i = 0; i < lines.length; i++) {
		const lineNo = i + 1;
		const line = lines[i];
		if (line.trim() === '') continue;
		const row = splitQuoted(line, ',');
		if (!row) fail('malformed', lineNo, 'a quoted field is not closed');
		const descriptor = row![0].toUpperCase();
		if (first && descriptor !== 'GROUP') fail('malformed', lineNo, 'not an AGS4 file: the first row is not "GROUP"');
		first = false;
		const fields = row!.slice(1);
		switch (descriptor) {
			case 'GROUP':
				if (!fields[0]) fail('malformed', lineNo, 'GROUP row without a group name');
				group = { name: fields[0].toUpperCase(), line: lineNo };
				if (group.name === 'SCPT') sawScpt = true;
				break;
			case 'HEADING':
				if (!group || group.headings) fail('malformed', lineNo, 'HEADING row out of place');
				group!.headings = fields.map((f) => f.toUpperCase());
				group!.headingLine = lineNo;
				break;
			case 'UNIT':
			case 'TYPE':
				if (!group?.headings) fail('malformed', lineNo, `${descriptor} row before HEADING`);
				if (fields.length !== group!.headings!.length) {
					fail('malformed', lineNo, `expected ${group!.headings!.length} fields after ${descriptor}, found ${fields.length}`);
				}
				if (descriptor === 'UNIT') group!.units = fields;
				break;
			case 'DATA': {
				if (!group?.headings) fail('malformed', lineNo, 'DATA row before HEADING');
				const g = group!;
				if (fields.length !== g.headings!.length) {
					fail('malformed', lineNo, `expected ${g.headings!.length} fields after DATA, found ${fields.length}`);
				}
				readData(g, fields, lineNo);
				break;
			}
			default:
				fail('malformed', lineNo, `unknown row descriptor '${row![0]}'`);
		}
	}

	function readData(g: Group, row: string[], lineNo: number): void {
		if (g.name === 'PROJ') {
			const k = heading(g, 'PROJ_ID');
			if (k >= 0 && projectId === undefined) projectId = row[k];
		} else if (g.name === 'LOCA') {
			const id = row[need(g, 'LOCA_ID')];
			const entry: { x?: number; y?: number; gl?: number } = {};
			for (const [name, key] of [['LOCA_NATE', 'x'], ['LOCA_NATN', 'y'], ['LOCA_GL', 'gl']] as const) {
				const k = heading(g, name);
				const v = cellNumber(row, k, lineNo, name) * (k >= 0 ? lengthFactor(g, k) : 1);
				if (!Number.isNaN(v)) entry[key] = v;
			}
			loca.set(id, entry);
		} else if (g.name === 'SCPG') {
			const id = row[need(g, 'LOCA_ID')];
			const kT = heading(g, 'SCPG_TESN');
			const v = cellNumber(row, heading(g, 'SCPG_CAR'), lineNo, 'SCPG_CAR');
			if (!Number.isNaN(v)) {
				if (!(v >= 0 && v <= 1)) fail('malformed', lineNo, `cone area ratio ${v} is outside 0–1`, 'SCPG_CAR');
				car.set(key(id, kT >= 0 ? row[kT] : ''), v);
			}
		} else if (g.name === 'SCPT') {
			if (!g.scpt) {
				const kDepth = need(g, 'SCPT_DPTH');
				const kQc = need(g, 'SCPT_RES');
				const kFs = need(g, 'SCPT_FRES');
				const kU2 = heading(g, 'SCPT_PWP2');
				g.scpt = {
					kId: need(g, 'LOCA_ID'), kDepth, kQc, kFs, kT: heading(g, 'SCPG_TESN'), kU2,
					fDepth: lengthFactor(g, kDepth), fQc: stressFactor(g, kQc), fFs: stressFactor(g, kFs), fU2: kU2 >= 0 ? stressFactor(g, kU2) : 1
				};
			}
			const { kId, kDepth, kQc, kFs, kT, kU2, fDepth, fQc, fFs, fU2 } = g.scpt;
			const id = row[kId];
			if (id.trim() === '') fail('missing-value', lineNo, 'LOCA_ID is empty', 'LOCA_ID');
			const tesn = kT >= 0 ? row[kT] : '';
			const k = key(id, tesn);
			let t = tests.get(k);
			if (!t) {
				t = { loca: id, tesn, depth: new Column(), qc: new Column(), fs: new Column(), u2: new Column(), hasU2: kU2 >= 0 };
				tests.set(k, t);
			}
			const d = cellNumber(row, kDepth, lineNo, 'SCPT_DPTH') * fDepth;
			if (Number.isNaN(d)) fail('missing-value', lineNo, 'depth is empty', 'SCPT_DPTH');
			if (d < 0) fail('malformed', lineNo, `depth ${d} m is negative`, 'SCPT_DPTH');
			if (t.depth.length > 0 && !(d > t.depth.last())) {
				fail('depth-not-increasing', lineNo, `depth ${d} m does not increase from ${t.depth.last()} m`, 'SCPT_DPTH');
			}
			t.depth.push(d);
			t.qc.push(cellNumber(row, kQc, lineNo, 'SCPT_RES') * fQc);
			t.fs.push(cellNumber(row, kFs, lineNo, 'SCPT_FRES') * fFs);
			t.u2.push(kU2 >= 0 ? cellNumber(row, kU2, lineNo, 'SCPT_PWP2') * fU2 : NaN);
			if (kU2 >= 0) t.hasU2 = true;
		}
	}

	if (!sawScpt) fail('malformed', undefined, 'no SCPT group (CPT data) in the file');
	if (tests.size === 0) fail('malformed', undefined, 'the SCPT group holds no DATA rows');

	const testsPerLoca = new Map<string, number>();
	for (const t of tests.values()) testsPerLoca.set(t.loca, (testsPerLoca.get(t.loca) ?? 0) + 1);
	const out: ParsedSounding[] = [];
	for (const t of tests.values()) {
		const s: ParsedSounding = {
			id: testsPerLoca.get(t.loca)! > 1 ? `${t.loca}/${t.tesn}` : t.loca,
			depth: t.depth.toArray(),
			qc: t.qc.toArray(),
			fs: t.fs.toArray()
		};
		if (t.hasU2) s.u2 = t.u2.toArray();
		const l = loca.get(t.loca);
		if (l?.x !== undefined) s.x = l.x;
		if (l?.y !== undefined) s.y = l.y;
		if (l?.gl !== undefined) s.groundElevation = l.gl;
		const a = car.get(key(t.loca, t.tesn)) ?? (t.tesn === '' ? undefined : car.get(key(t.loca, '')));
		if (a !== undefined) s.areaRatio = a;
		s.meta = { LOCA_ID: t.loca, SCPG_TESN: t.tesn };
		if (projectId !== undefined) s.meta.PROJ_ID = projectId;
		out.push(s);
	}
	return out;
}

function key(loca: string, tesn: string): string {
	return `${loca}\u0000${tesn}`;
}
