import { CptParseError } from './errors';
import type { ParseOptions } from './types';
import { isMissingCell, prepareText, splitLines, splitQuoted } from './text';
import { locateHeader, parseCell, trimTrailing } from './delimitedText';
import type { Delimiter } from './delimitedText';
import type { DelimitedLengthUnit, DelimitedMapping, DelimitedStressUnit } from './parseDelimited';
import { lengthUnitFactor, stressUnitFactor } from './units';
import { groundRank, idRank, splitName } from './headerNames';

/** A mapping guessed from the header; depth, qc or fs stay undefined when no column looks like them. */
export type DelimitedMappingGuess = Omit<DelimitedMapping, 'depth' | 'qc' | 'fs'> & {
	depth?: string;
	qc?: string;
	fs?: string;
};

/** What the column-mapping step shows: the header, the first rows and a guessed mapping. */
export interface DelimitedPreview {
	delimiter: Delimiter;
	headers: string[];
	/** The first rows as text cells (at most `rows`). */
	rows: string[][];
	/** Non-blank lines after the header in the whole file. */
	rowCount: number;
	guess: DelimitedMappingGuess;
}

/** Options of {@link previewDelimited}. */
export interface PreviewOptions extends ParseOptions {
	/** Rows to return; default 10. */
	rows?: number;
}

/**
 * Reads the header and first rows of delimited text and guesses a mapping for {@link parseDelimited}:
 * columns by their names, ignoring case, spaces and punctuation (depth, qc, fs, u2; a sounding id such as
 * PointID, Test ID, CPT, Location, LOCA_ID, Sounding or Name, unless its value changes on every row;
 * easting/northing or chainage; a ground elevation such as "Z (m NAP)", Elevation, Ground level or GL, when it
 * holds one value per sounding; the area ratio; AGS-style names such as SCPT_RES), units from a unit in the
 * header ("qc (MPa)", "fs [kPa]", "depth_ft", "m NAP"), else from the magnitude of the first values (qc above
 * 300 read as kPa, fs and u2 below 2 as MPa). All rules of our own; the guess is for a person to confirm,
 * never applied silently.
 *
 * @throws CptParseError for empty, binary or oversized text, or a header without a delimiter.
 */
export function previewDelimited(text: string, options: PreviewOptions = {}): DelimitedPreview {
	const { file, rows: wanted = 10 } = options;
	const lines = splitLines(prepareText(text, file));
	const { header, delimiter } = locateHeader(lines, file);
	const headers = splitQuoted(lines[header], delimiter);
	if (!headers) throw new CptParseError({ code: 'malformed', file, line: header + 1, detail: 'a quoted field is not closed' });
	trimTrailing(headers, 0);

	const rows: string[][] = [];
	const sample: string[][] = [];
	let rowCount = 0;
	for (let i = header + 1; i < lines.length; i++) {
		if (lines[i].trim() === '') continue;
		rowCount++;
		if (sample.length >= 200) continue;
		const f = splitQuoted(lines[i], delimiter);
		if (!f) continue;
		const r = trimTrailing(f, headers.length);
		sample.push(r);
		if (rows.length < wanted) rows.push(r);
	}

	const names = headers.map(splitName);
	const find = (re: RegExp, exclude?: RegExp): string | undefined => {
		const k = names.findIndex((n) => re.test(n.key) && !(exclude && exclude.test(n.key)));
		return k >= 0 ? headers[k] : undefined;
	};
	const column = (k: string | undefined): { column: string } | undefined => (k === undefined ? undefined : { column: k });
	const values = (name: string | undefined): number[] => {
		const k = name === undefined ? -1 : headers.indexOf(name);
		const out: number[] = [];
		if (k < 0) return out;
		for (const r of sample) {
			const cell = r[k];
			if (cell === undefined || isMissingCell(cell)) continue;
			const v = parseCell(cell, delimiter);
			if (v !== undefined) out.push(v);
		}
		return out;
	};
	const unitIn = (name: string | undefined): string | undefined => (name === undefined ? undefined : names[headers.indexOf(name)].unit);

	const depth = find(/^(depth|penetration|penetrationlength|dpth|scptdpth|correcteddepth|sondeerlengte|diepte|gecorrigeerdediepte)/);
	const qc = find(/^(qc|coneresistance|tipresistance|conetip|coneres|scptres|conusweerstand)/);
	const fs = find(/^(fs|sleevefriction|localfriction|sleeve|friction|scptfres|plaatselijkewrijving|wrijving)/, /ratio|rf|getal/);
	const u2 = find(/^(u2|porepressure|porewaterpressure|pwp2|pwp|scptpwp2)/);
	const taken = new Set([depth, qc, fs, u2]);
	// A column that takes a new value on (nearly) every row numbers the rows, not the soundings.
	const numbersRows = (k: number): boolean => sample.length > 3 && new Set(sample.map((r) => r[k]?.trim())).size >= sample.length - 1;
	const id = ranked(headers, idRank, (k) => !taken.has(headers[k]) && !numbersRows(k));
	const x = find(/^(x|easting|east|locanate)$/);
	const y = find(/^(y|northing|north|locanatn)$/);
	const chainage = find(/^(chainage|station|ch)$/);
	// A ground elevation holds one value per sounding; an elevation that changes down a sounding is the readings' own.
	const kId = id === undefined ? -1 : headers.indexOf(id);
	const onePerSounding = (k: number): boolean => {
		const seen = new Map<string, string>();
		for (const r of sample) {
			const cell = (r[k] ?? '').trim();
			if (cell === '' || isMissingCell(cell)) continue;
			const key = kId >= 0 ? (r[kId] ?? '').trim() : '';
			if (seen.has(key) && seen.get(key) !== cell) return false;
			seen.set(key, cell);
		}
		return seen.size > 0;
	};
	const ground = ranked(headers, groundRank, (k) => !taken.has(headers[k]) && headers[k] !== x && headers[k] !== y && onePerSounding(k));
	const area = find(/^(arearatio|netarearatio|a|car|scpgcar)$/);

	const guess: DelimitedMappingGuess = {
		delimiter,
		depth,
		qc,
		fs,
		units: {
			depth: lengthUnit(unitIn(depth)) ?? 'm',
			qc: stressUnit(unitIn(qc)) ?? (median(values(qc)) > 300 ? 'kPa' : 'MPa'),
			fs: stressUnit(unitIn(fs)) ?? (median(values(fs)) < 2 ? 'MPa' : 'kPa')
		}
	};
	if (u2 !== undefined) {
		guess.u2 = u2;
		guess.units.u2 = stressUnit(unitIn(u2)) ?? (median(values(u2).map(Math.abs)) < 2 ? 'MPa' : 'kPa');
	}
	const coordUnit = lengthUnit(unitIn(x ?? chainage ?? ground));
	if (coordUnit) guess.units.coordinates = coordUnit;
	if (id !== undefined) guess.id = id;
	if (x !== undefined) guess.x = column(x);
	if (y !== undefined) guess.y = column(y);
	if (chainage !== undefined) guess.chainage = column(chainage);
	if (ground !== undefined) guess.groundElevation = column(ground);
	if (area !== undefined) guess.areaRatio = column(area);
	return { delimiter, headers, rows, rowCount, guess };
}

function stressUnit(unit: string | undefined): DelimitedStressUnit | undefined {
	const f = unit === undefined ? undefined : stressUnitFactor(unit);
	if (f === 1) return 'kPa';
	if (f === 1000) return 'MPa';
	if (f !== undefined && unit!.trim().toLowerCase() === 'tsf') return 'tsf';
	return undefined;
}

/** m or ft, also when a vertical datum follows the unit ("m NAP", "mAOD", "ft MSL"). */
function lengthUnit(unit: string | undefined): DelimitedLengthUnit | undefined {
	if (unit === undefined) return undefined;
	const datum = /^\s*(m|ft)(?:\s+\S.*|[A-Z]{2,}.*)$/.exec(unit);
	const f = lengthUnitFactor(datum ? datum[1] : unit);
	if (f === 1) return 'm';
	if (f !== undefined && (datum ? datum[1] : unit).trim().toLowerCase() === 'ft') return 'ft';
	return undefined;
}

/** The header with the best rank that passes `ok`, or undefined. */
function ranked(headers: string[], rank: (h: string) => number, ok: (k: number) => boolean): string | undefined {
	let best: string | undefined;
	let bestRank = Infinity;
	headers.forEach((h, k) => {
		const r = rank(h);
		if (r >= 0 && r < bestRank && ok(k)) {
			best = h;
			bestRank = r;
		}
	});
	return best;
}

function median(v: number[]): number {
	if (v.length === 0) return NaN;
	const s = [...v].sort((a, b) => a - b);
	const h = s.length >> 1;
	return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}
