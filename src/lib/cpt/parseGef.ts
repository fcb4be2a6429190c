import { CptParseError } from './errors';
import type { CptParseErrorCode } from './errors';
import type { ParseOptions, ParsedSounding } from './types';
import { lengthUnitFactor, stressUnitFactor } from './units';
import { Column, parseNumber, prepareText, splitLines, stem } from './text';

/*
 * GEF (Geotechnical Exchange Format) for CPT data, the open text format. The keywords read here —
 * #GEFID, #COLUMN, #COLUMNINFO (column, unit, name, quantity number), #COLUMNVOID, #COLUMNSEPARATOR,
 * #RECORDSEPARATOR, #XYID, #ZID, #MEASUREMENTVAR, #TESTID, #EOH — and the quantity numbers
 * (1 penetration length, 2 cone resistance, 3 local friction, 4 friction ratio, 6 pore pressure u2,
 * 11 corrected depth; measurement variable 3 = net area quotient of the cone tip) are written from memory
 * of the GEF-CPT report, not checked against the published text; see /work/shared/REFERENCES.md.
 */

/** GEF quantity numbers this parser uses (from memory, see the file comment). */
export const GEF_QUANTITY = {
	penetrationLength: 1,
	coneResistance: 2,
	localFriction: 3,
	frictionRatio: 4,
	porePressureU2: 6,
	correctedDepth: 11
} as const;

/** GEF measurement-variable number of the cone's net area quotient (from memory). */
export const GEF_MEASUREMENTVAR_AREA_RATIO = 3;

interface ColumnInfo {
	index: number;
	unit: string;
	name: string;
	quantity: number;
	line: number;
}

/**
 * Report codes of GEF files that are not CPTs (from memory of the GEF family: GEF-BORE-Report for borehole
 * logs, GEF-DISS-Report for dissipation tests), with what to call them in a refusal.
 */
const NOT_CPT: { code: RegExp; what: string }[] = [
	{ code: /GEF-BORE/i, what: 'a borehole log' },
	{ code: /GEF-DISS/i, what: 'a dissipation test' }
];

const KEYWORD = /^#\s*([A-Za-z][A-Za-z0-9_]*)\s*=(.*)$/;
const META_KEYS = new Set(['GEFID', 'TESTID', 'PROJECTID', 'COMPANYID', 'FILEOWNER', 'FILEDATE', 'STARTDATE', 'STARTTIME']);

/**
 * Parses one GEF CPT file into a sounding in SI units (m, kPa), honouring each column's declared unit (in any
 * case: "Mpa", "kpa"). Depth comes from corrected depth (quantity 11) when present, else penetration length (1);
 * where corrected depth is void, penetration length fills in. A depth column written as negative numbers
 * growing downward (a sign convention some writers use) is read as depth below ground. Both are said in the
 * sounding's `notes`. fs comes from local friction (3), else from the friction ratio (4) as Rf·qc/100. Void
 * values become NaN; columns the parser does not use are kept, unconverted, in `extra` under their names.
 * A file whose #REPORTCODE or #PROCEDURECODE names a borehole log (GEF-BORE) or a dissipation test (GEF-DISS)
 * is refused as not a CPT.
 *
 * @returns an array holding the file's one sounding (the same shape as the multi-sounding parsers).
 * @throws CptParseError naming the line and column of the first problem.
 */
export function parseGef(text: string, options: ParseOptions = {}): ParsedSounding[] {
	const { file } = options;
	const fail = (code: CptParseErrorCode, line: number | undefined, detail: string, column?: string): never => {
		throw new CptParseError({ code, file, line, column, detail });
	};
	const lines = splitLines(prepareText(text, file));

	let eoh = -1;
	let gefid = false;
	let columnCount: number | undefined;
	const infos: ColumnInfo[] = [];
	const voids = new Map<number, number>();
	let columnSeparator: string | undefined;
	let recordSeparator: string | undefined;
	const meta: Record<string, string> = {};
	let x: number | undefined;
	let y: number | undefined;
	let groundElevation: number | undefined;
	let areaRatio: number | undefined;

	const fields = (value: string): string[] => value.split(',').map((f) => f.trim());
	const integer = (s: string, line: number, what: string): number => {
		const v = parseNumber(s);
		if (v === undefined || !Number.isInteger(v)) fail('not-a-number', line, `'${s}' is not a whole number`, what);
		return v as number;
	};
	const number = (s: string | undefined, line: number, what: string): number => {
		const v = s === undefined ? undefined : parseNumber(s);
		if (v === undefined) fail('not-a-number', line, `'${s ?? ''}' is not a number`, what);
		return v as number;
	};

	for (let i = 0; i < lines.length; i++) {
		const raw = lines[i];
		const lineNo = i + 1;
		const trimmed = raw.trim();
		if (trimmed === '') continue;
		const match = KEYWORD.exec(trimmed);
		if (!match) {
			if (!gefid) fail('malformed', lineNo, 'not a GEF file: it does not start with #GEFID');
			fail('malformed', lineNo, 'expected a #KEYWORD= line in the header');
		}
		const key = match![1].toUpperCase();
		const value = match![2];
		if (!gefid && key !== 'GEFID') fail('malformed', lineNo, 'not a GEF file: it does not start with #GEFID');
		if (META_KEYS.has(key)) meta[key] = value.trim();
		switch (key) {
			case 'GEFID':
				gefid = true;
				break;
			case 'REPORTCODE':
			case 'PROCEDURECODE': {
				const code = fields(value)[0];
				const other = NOT_CPT.find((n) => n.code.test(code));
				if (other) fail('not-a-cpt', lineNo, `this is ${other.what}, not a CPT (${key} ${code}); only GEF-CPT files hold soundings`);
				break;
			}
			case 'COLUMN': {
				columnCount = integer(fields(value)[0], lineNo, 'COLUMN');
				if (columnCount < 1 || columnCount > 1000) fail('malformed', lineNo, `#COLUMN= ${columnCount} is out of range`);
				break;
			}
			case 'COLUMNINFO': {
				const f = fields(value);
				if (f.length < 4) fail('malformed', lineNo, '#COLUMNINFO needs column, unit, name and quantity');
				const index = integer(f[0], lineNo, 'COLUMNINFO');
				const quantity = integer(f[f.length - 1], lineNo, 'COLUMNINFO');
				if (index < 1 || index > 1000) fail('malformed', lineNo, `column ${index} is out of range`);
				if (infos.some((c) => c.index === index)) fail('malformed', lineNo, `column ${index} is described twice`);
				infos.push({ index, unit: f[1], name: f.slice(2, -1).join(', ') || `column ${index}`, quantity, line: lineNo });
				break;
			}
			case 'COLUMNVOID': {
				const f = fields(value);
				voids.set(integer(f[0], lineNo, 'COLUMNVOID'), number(f[1], lineNo, 'COLUMNVOID'));
				break;
			}
			case 'COLUMNSEPARATOR':
				columnSeparator = separatorOf(value);
				break;
			case 'RECORDSEPARATOR':
				recordSeparator = separatorOf(value);
				break;
			case 'XYID': {
				const f = fields(value);
				x = number(f[1], lineNo, 'XYID');
				y = number(f[2], lineNo, 'XYID');
				break;
			}
			case 'ZID':
				groundElevation = number(fields(value)[1], lineNo, 'ZID');
				break;
			case 'MEASUREMENTVAR': {
				const f = fields(value);
				if (parseNumber(f[0]) === GEF_MEASUREMENTVAR_AREA_RATIO) {
					areaRatio = number(f[1], lineNo, 'MEASUREMENTVAR');
					if (!(areaRatio >= 0 && areaRatio <= 1)) fail('malformed', lineNo, `net area quotient ${areaRatio} is outside 0–1`);
				}
				break;
			}
		}
		if (key === 'EOH') {
			eoh = i;
			break;
		}
	}
	if (!gefid) fail('malformed', 1, 'not a GEF file: it does not start with #GEFID');
	if (eoh < 0) fail('malformed', lines.length, 'no #EOH= ends the header');
	const eohLine = eoh + 1;

	const count = columnCount ?? Math.max(0, ...infos.map((c) => c.index));
	for (const c of infos) if (c.index > count) fail('malformed', c.line, `column ${c.index} is beyond #COLUMN= ${count}`);
	const byQuantity = (q: number): ColumnInfo | undefined => infos.find((c) => c.quantity === q);
	const depthInfo = byQuantity(GEF_QUANTITY.correctedDepth) ?? byQuantity(GEF_QUANTITY.penetrationLength);
	const qcInfo = byQuantity(GEF_QUANTITY.coneResistance);
	const fsInfo = byQuantity(GEF_QUANTITY.localFriction);
	const rfInfo = fsInfo ? undefined : byQuantity(GEF_QUANTITY.frictionRatio);
	const u2Info = byQuantity(GEF_QUANTITY.porePressureU2);
	if (!depthInfo) fail('missing-column', eohLine, 'no penetration length (quantity 1) or corrected depth (11)', 'depth');
	if (!qcInfo) fail('missing-column', eohLine, 'no cone resistance (quantity 2)', 'qc');
	if (!fsInfo && !rfInfo) fail('missing-column', eohLine, 'no local friction (quantity 3) or friction ratio (4)', 'fs');

	const unitOf = (info: ColumnInfo, kind: 'length' | 'stress'): number => {
		const factor = kind === 'length' ? lengthUnitFactor(info.unit) : stressUnitFactor(info.unit);
		if (factor === undefined) fail('unknown-unit', info.line, `unknown ${kind} unit '${info.unit}'`, info.name);
		return factor as number;
	};
	const depthFactor = unitOf(depthInfo!, 'length');
	const qcFactor = unitOf(qcInfo!, 'stress');
	const fsFactor = fsInfo ? unitOf(fsInfo, 'stress') : 1;
	if (rfInfo && rfInfo.unit.trim() !== '%') fail('unknown-unit', rfInfo.line, `friction ratio unit '${rfInfo.unit}' is not %`, rfInfo.name);
	const u2Factor = u2Info ? unitOf(u2Info, 'stress') : 1;

	const penInfo = byQuantity(GEF_QUANTITY.penetrationLength);
	const corrInfo = depthInfo === penInfo ? undefined : depthInfo;
	const used = new Set([depthInfo!, qcInfo!, fsInfo ?? rfInfo!, ...(u2Info ? [u2Info] : [])].map((c) => c.index));
	const extras = infos.filter((c) => !used.has(c.index));
	const cols = new Map<number, Column>();
	for (let k = 1; k <= count; k++) cols.set(k, new Column());
	const nameOf = (k: number): string => infos.find((c) => c.index === k)?.name ?? `column ${k}`;
	const recordLines: number[] = [];

	const readRecord = (values: string[], lineNo: number): void => {
		while (values.length > count && values[values.length - 1] === '') values.pop();
		if (values.length !== count) fail('malformed', lineNo, `expected ${count} values, found ${values.length}`);
		for (let k = 1; k <= count; k++) {
			const cell = values[k - 1];
			let v = parseNumber(cell);
			if (v === undefined) fail('not-a-number', lineNo, `'${cell}' is not a number`, nameOf(k));
			if (voids.has(k) && voids.get(k) === v) v = NaN;
			cols.get(k)!.push(v as number);
		}
		recordLines.push(lineNo);
	};

	const splitFields = (record: string): string[] => {
		const r = record.trim();
		if (columnSeparator !== undefined && columnSeparator.trim() !== '') return r.split(columnSeparator).map((s) => s.trim());
		return r === '' ? [] : r.split(/\s+/);
	};
	for (let i = eoh + 1; i < lines.length; i++) {
		const line = lines[i];
		if (line.trim() === '') continue;
		const records = recordSeparator ? line.split(recordSeparator) : [line];
		if (recordSeparator && records.length > 1 && records[records.length - 1].trim() === '') records.pop();
		for (const record of records) readRecord(splitFields(record), i + 1);
	}
	if (recordLines.length === 0) fail('malformed', eohLine, 'no readings after #EOH');

	const scaled = (info: ColumnInfo, factor: number): Float64Array => {
		const a = cols.get(info.index)!.toArray();
		if (factor !== 1) for (let i = 0; i < a.length; i++) a[i] *= factor;
		return a;
	};
	const notes: string[] = [];
	const negated = new Set<ColumnInfo>();
	const depthColumn = (info: ColumnInfo, factor: number): Float64Array => {
		const a = scaled(info, factor);
		if (negativeDownward(a)) {
			for (let i = 0; i < a.length; i++) a[i] = -a[i];
			negated.add(info);
			notes.push(`${info.name} is recorded as negative numbers growing downward; read as depth below ground`);
		}
		return a;
	};
	const depth = depthColumn(depthInfo!, depthFactor);
	const filled = new Uint8Array(depth.length);
	if (corrInfo) {
		const voidRows: number[] = [];
		for (let i = 0; i < depth.length; i++) if (Number.isNaN(depth[i])) voidRows.push(i);
		if (voidRows.length > 0 && penInfo) {
			const pen = depthColumn(penInfo, unitOf(penInfo, 'length'));
			for (const i of voidRows) {
				if (Number.isNaN(pen[i])) fail('missing-value', recordLines[i], 'depth is void in both corrected depth and penetration length', corrInfo.name);
				depth[i] = pen[i];
				filled[i] = 1;
			}
			notes.push(fallbackNote(voidRows, depth, corrInfo.name, penInfo.name, recordLines));
		}
	}
	for (let i = 0; i < depth.length; i++) {
		const info = filled[i] ? penInfo! : depthInfo!;
		const d = depth[i];
		const line = recordLines[i];
		if (Number.isNaN(d)) fail('missing-value', line, 'depth is void', nameOf(depthInfo!.index));
		if (d < 0) fail('malformed', line, `depth ${d} m is negative`, nameOf(info.index));
		if (i > 0 && !(d > depth[i - 1])) {
			const sign = negated.has(info) ? ' (read from negative numbers in the file)' : '';
			fail('depth-not-increasing', line, `depth ${d} m does not increase from ${depth[i - 1]} m${sign}`, nameOf(info.index));
		}
	}

	const qc = scaled(qcInfo!, qcFactor);
	let fs: Float64Array;
	if (fsInfo) fs = scaled(fsInfo, fsFactor);
	else {
		fs = cols.get(rfInfo!.index)!.toArray();
		for (let i = 0; i < fs.length; i++) fs[i] = (fs[i] / 100) * qc[i];
	}
	const sounding: ParsedSounding = { id: meta.TESTID || stem(file) || 'CPT', depth, qc, fs };
	if (u2Info) sounding.u2 = scaled(u2Info, u2Factor);
	if (x !== undefined) sounding.x = x;
	if (y !== undefined) sounding.y = y;
	if (groundElevation !== undefined) sounding.groundElevation = groundElevation;
	if (areaRatio !== undefined) sounding.areaRatio = areaRatio;
	if (extras.length > 0) {
		sounding.extra = {};
		for (const c of extras) sounding.extra[c.name] = cols.get(c.index)!.toArray();
	}
	if (Object.keys(meta).length > 0) sounding.meta = meta;
	if (notes.length > 0) sounding.notes = notes;
	return [sounding];
}

/**
 * Whether a depth column follows the convention of negative numbers growing downward: at least two readings,
 * none above zero and some below (a rule of our own; one reading cannot show a direction).
 */
function negativeDownward(a: Float64Array): boolean {
	let readings = 0;
	let negative = false;
	for (const v of a) {
		if (Number.isNaN(v)) continue;
		if (v > 0) return false;
		if (v < 0) negative = true;
		readings++;
	}
	return negative && readings >= 2;
}

/** The import-summary note for corrected depth filled in from penetration length. */
function fallbackNote(rows: number[], depth: Float64Array, corrected: string, penetration: string, lines: number[]): string {
	const n = rows.length;
	const leading = rows.every((r, k) => r === k);
	const readings = `${n} ${n === 1 ? 'reading' : 'readings'}`;
	const where =
		n === depth.length
			? 'in every reading'
			: leading
				? `in the first ${readings} (to ${depth[rows[n - 1]]} m)`
				: `in ${readings} (lines ${lines[rows[0]]}–${lines[rows[n - 1]]})`;
	return `${corrected} (quantity 11) is void ${where}; ${penetration} is used there`;
}

/** A separator keyword's value: the character(s) after '=', spaces trimmed unless the separator is a space. */
function separatorOf(value: string): string | undefined {
	const t = value.trim();
	if (t !== '') return t;
	return value.length > 0 ? value[0] : undefined;
}
