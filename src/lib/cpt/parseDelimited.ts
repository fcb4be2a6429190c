import { DEFAULT_AREA_RATIO, FT_TO_M, TSF_TO_KPA } from './constants';
import { CptParseError } from './errors';
import type { CptParseErrorCode } from './errors';
import type { ParseOptions, ParsedSounding } from './types';
import { Column, isMissingCell, parseNumber, prepareText, splitLines, splitQuoted, stem } from './text';
import { idRank } from './headerNames';
import { locateHeader, parseCell, trimTrailing } from './delimitedText';
import type { Delimiter } from './delimitedText';

/** Length units of delimited text. */
export type DelimitedLengthUnit = 'm' | 'ft';
/** Stress units of delimited text. */
export type DelimitedStressUnit = 'MPa' | 'kPa' | 'tsf';
/** A per-sounding value read from a column (its first non-empty cell in the sounding) or fixed for the file. */
export type ColumnOrValue = { column: string } | { value: number };

/** How the columns of a delimited file map to sounding fields. Columns are named by their header text. */
export interface DelimitedMapping {
	/** Delimiter; detected when absent. */
	delimiter?: Delimiter;
	/** Column holding the sounding id; without it the file is one sounding. */
	id?: string;
	/** Id of a one-sounding file; default the file name without extension, else "CPT". */
	defaultId?: string;
	depth: string;
	qc: string;
	fs: string;
	u2?: string;
	/** Further numeric columns kept, unconverted, in `extra`. */
	extra?: string[];
	units: {
		depth: DelimitedLengthUnit;
		qc: DelimitedStressUnit;
		fs: DelimitedStressUnit;
		u2?: DelimitedStressUnit;
		/** Unit of x, y, chainage and ground elevation (columns and fixed values); default m. */
		coordinates?: DelimitedLengthUnit;
	};
	x?: ColumnOrValue;
	y?: ColumnOrValue;
	chainage?: ColumnOrValue;
	groundElevation?: ColumnOrValue;
	/** Cone net area ratio; default 0.8. */
	areaRatio?: ColumnOrValue;
}

const LENGTH: Record<DelimitedLengthUnit, number> = { m: 1, ft: FT_TO_M };
const STRESS: Record<DelimitedStressUnit, number> = { kPa: 1, MPa: 1000, tsf: TSF_TO_KPA };

interface Building {
	id: string;
	depth: Column;
	qc: Column;
	fs: Column;
	u2: Column;
	extra: Column[];
	fixed: Map<string, number>;
	/** The sounding's previous row, to name the columns that change where its depth restarts. */
	lastRow: string[];
	firstDepth: number;
}

/**
 * Parses comma-, semicolon- or tab-separated text with a header row into soundings in SI units (m, kPa),
 * following a column mapping (see {@link previewDelimited} for a guessed one). An id column splits the file
 * into several soundings, in order of first appearance; rows of one sounding need not be adjacent but their
 * depths must increase. Where a sounding's depth falls back to near its start, the refusal says the file
 * probably holds several soundings and names the columns that change there, as candidates for the id. Empty cells (and NaN, NA, n/a, -, null) become NaN; with a semicolon or tab delimiter,
 * decimal commas are accepted. Unit factors are exact: 1 ft = 0.3048 m, 1 tsf = 95.760 52 kPa.
 *
 * @throws CptParseError naming the line and column of the first problem.
 */
export function parseDelimited(text: string, mapping: DelimitedMapping, options: ParseOptions = {}): ParsedSounding[] {
	const { file } = options;
	const fail = (code: CptParseErrorCode, line: number | undefined, detail: string, column?: string): never => {
		throw new CptParseError({ code, file, line, column, detail });
	};
	const lines = splitLines(prepareText(text, file));
	const { header, delimiter } = locateHeader(lines, file, mapping.delimiter);
	const headers = splitQuoted(lines[header], delimiter);
	if (!headers) return fail('malformed', header + 1, 'a quoted field is not closed');
	trimTrailing(headers, 0);
	const headerLine = header + 1;

	const units = mapping.units ?? ({} as DelimitedMapping['units']);
	const stressFactor = (name: 'qc' | 'fs' | 'u2'): number => {
		const unit = units[name];
		const f = unit === undefined ? undefined : STRESS[unit];
		if (f === undefined) fail('unknown-unit', undefined, `unknown unit '${unit ?? ''}' for ${name} (MPa, kPa or tsf)`, name);
		return f as number;
	};
	const lengthFactor = (unit: string | undefined, name: string): number => {
		const f = unit === undefined ? undefined : LENGTH[unit as DelimitedLengthUnit];
		if (f === undefined) fail('unknown-unit', undefined, `unknown unit '${unit ?? ''}' for ${name} (m or ft)`, name);
		return f as number;
	};
	const depthFactor = lengthFactor(units.depth, 'depth');
	const qcFactor = stressFactor('qc');
	const fsFactor = stressFactor('fs');
	const u2Factor = mapping.u2 !== undefined ? stressFactor('u2') : 1;
	const coordFactor = lengthFactor(units.coordinates ?? 'm', 'coordinates');

	const indexOf = (name: string, role: string): number => {
		const k = headers.indexOf(name);
		if (k < 0) fail('missing-column', headerLine, `no column '${name}' for ${role} in the header`, name);
		if (headers.indexOf(name, k + 1) >= 0) fail('malformed', headerLine, `two columns are named '${name}'`, name);
		return k;
	};
	const kDepth = indexOf(mapping.depth, 'depth');
	const kQc = indexOf(mapping.qc, 'qc');
	const kFs = indexOf(mapping.fs, 'fs');
	const kU2 = mapping.u2 !== undefined ? indexOf(mapping.u2, 'u2') : -1;
	const kId = mapping.id !== undefined ? indexOf(mapping.id, 'sounding id') : -1;
	const extras = (mapping.extra ?? []).map((name) => ({ name, k: indexOf(name, 'an extra column') }));
	const measured = new Set([kDepth, kQc, kFs, kU2, kId, ...extras.map((e) => e.k)]);
	const perSounding: { key: keyof typeof SOUNDING_FIELDS; k: number; value?: number }[] = [];
	for (const key of Object.keys(SOUNDING_FIELDS) as (keyof typeof SOUNDING_FIELDS)[]) {
		const spec = mapping[key];
		if (spec === undefined) continue;
		if ('column' in spec) perSounding.push({ key, k: indexOf(spec.column, SOUNDING_FIELDS[key]) });
		else {
			if (!Number.isFinite(spec.value)) fail('not-a-number', undefined, `fixed ${SOUNDING_FIELDS[key]} is not a number`, key);
			perSounding.push({ key, k: -1, value: spec.value });
		}
	}

	const soundings = new Map<string, Building>();
	const singleId = mapping.defaultId ?? stem(file) ?? 'CPT';
	const cellValue = (cell: string, lineNo: number, column: string): number => {
		if (isMissingCell(cell)) return NaN;
		const v = parseCell(cell, delimiter);
		if (v === undefined) fail('not-a-number', lineNo, `'${cell.trim()}' is not a number`, column);
		return v as number;
	};

	for (let i = header + 1; i < lines.length; i++) {
		if (lines[i].trim() === '') continue;
		const lineNo = i + 1;
		const raw = splitQuoted(lines[i], delimiter);
		if (!raw) fail('malformed', lineNo, 'a quoted field is not closed');
		const row = trimTrailing(raw!, headers.length);
		if (row.length !== headers.length) fail('malformed', lineNo, `expected ${headers.length} fields, found ${row.length}`);
		const id = kId >= 0 ? row[kId].trim() : singleId;
		if (id === '') fail('missing-value', lineNo, 'sounding id is empty', headers[kId]);
		let s = soundings.get(id);
		if (!s) {
			s = { id, depth: new Column(), qc: new Column(), fs: new Column(), u2: new Column(), extra: extras.map(() => new Column()), fixed: new Map(), lastRow: row, firstDepth: NaN };
			soundings.set(id, s);
		}
		const d = cellValue(row[kDepth], lineNo, headers[kDepth]) * depthFactor;
		if (Number.isNaN(d)) fail('missing-value', lineNo, 'depth is empty', headers[kDepth]);
		if (d < 0) fail('malformed', lineNo, `depth ${d} m is negative`, headers[kDepth]);
		if (s.depth.length > 0 && !(d > s.depth.last())) {
			const prev = s.depth.last();
			const detail = restarts(d, prev, s.firstDepth)
				? restartDetail(d, prev, kId >= 0 ? { header: headers[kId], id } : undefined, changedColumns(headers, s.lastRow, row, measured))
				: `depth ${d} m does not increase from ${prev} m`;
			fail('depth-not-increasing', lineNo, detail, headers[kDepth]);
		}
		if (s.depth.length === 0) s.firstDepth = d;
		s.lastRow = row;
		s.depth.push(d);
		s.qc.push(cellValue(row[kQc], lineNo, headers[kQc]) * qcFactor);
		s.fs.push(cellValue(row[kFs], lineNo, headers[kFs]) * fsFactor);
		if (kU2 >= 0) s.u2.push(cellValue(row[kU2], lineNo, headers[kU2]) * u2Factor);
		extras.forEach((e, j) => s!.extra[j].push(cellValue(row[e.k], lineNo, e.name)));
		for (const p of perSounding) {
			if (p.k < 0 || s.fixed.has(p.key)) continue;
			const v = cellValue(row[p.k], lineNo, headers[p.k]);
			if (Number.isNaN(v)) continue;
			if (p.key === 'areaRatio' && !(v >= 0 && v <= 1)) fail('malformed', lineNo, `area ratio ${v} is outside 0–1`, headers[p.k]);
			s.fixed.set(p.key, v);
		}
	}
	if (soundings.size === 0) fail('malformed', headerLine, 'no rows after the header');

	const fixedValue = (s: Building, key: keyof typeof SOUNDING_FIELDS): number | undefined => {
		const p = perSounding.find((q) => q.key === key);
		if (!p) return undefined;
		const v = p.k < 0 ? p.value : s.fixed.get(key);
		if (v === undefined) return undefined;
		return key === 'areaRatio' ? v : v * coordFactor;
	};
	const out: ParsedSounding[] = [];
	for (const s of soundings.values()) {
		const p: ParsedSounding = { id: s.id, depth: s.depth.toArray(), qc: s.qc.toArray(), fs: s.fs.toArray() };
		if (kU2 >= 0) p.u2 = s.u2.toArray();
		for (const key of ['x', 'y', 'chainage', 'groundElevation'] as const) {
			const v = fixedValue(s, key);
			if (v !== undefined) p[key] = v;
		}
		const a = fixedValue(s, 'areaRatio') ?? DEFAULT_AREA_RATIO;
		if (!(a >= 0 && a <= 1)) fail('malformed', undefined, `area ratio ${a} is outside 0–1`, 'areaRatio');
		p.areaRatio = a;
		if (extras.length > 0) {
			p.extra = {};
			extras.forEach((e, j) => (p.extra![e.name] = s.extra[j].toArray()));
		}
		out.push(p);
	}
	return out;
}

/**
 * Whether a depth that does not increase starts a sounding over: it falls back into the top tenth of the
 * depths read so far (a rule of our own; a repeated or slightly smaller depth is a recording error instead).
 */
function restarts(d: number, prev: number, first: number): boolean {
	return d < prev && d <= first + 0.1 * (prev - first);
}

/** The refusal when depths restart: most likely several soundings read as one. */
function restartDetail(d: number, prev: number, id: { header: string; id: string } | undefined, candidates: string[]): string {
	const where = id ? `within sounding ${id.id} (column '${id.header}')` : 'with no sounding id column chosen';
	const hint = id
		? `choose the column that tells the soundings apart as the sounding id`
		: 'choose the column that names them as the sounding id';
	const named = candidates.length > 0 ? `; columns that change here: ${candidates.map((c) => `'${c}'`).join(', ')}` : '';
	return `depth restarts at ${d} m after ${prev} m ${where}: the file probably holds several soundings; ${hint}${named}`;
}

/**
 * Columns (other than the measured ones) whose cell differs between two rows, those named like a sounding id
 * first, then the non-numeric ones; at most three.
 */
function changedColumns(headers: string[], before: string[], after: string[], measured: Set<number>): string[] {
	const changed: { h: string; score: number }[] = [];
	headers.forEach((h, k) => {
		if (measured.has(k) || (before[k] ?? '').trim() === (after[k] ?? '').trim()) return;
		const rank = idRank(h);
		const text = parseNumber(after[k] ?? '') === undefined;
		changed.push({ h, score: rank >= 0 ? rank : text ? 1000 : 2000 });
	});
	return changed.sort((a, b) => a.score - b.score).slice(0, 3).map((c) => c.h);
}

const SOUNDING_FIELDS = {
	x: 'easting',
	y: 'northing',
	chainage: 'chainage',
	groundElevation: 'ground elevation',
	areaRatio: 'area ratio'
} as const;
