import { describeFlags } from '$lib/cpt';
import { csvField as field, roundedCell } from '$lib/csv';
import { PROPERTY_INFO, labelWithUnit, type PropertyKey } from '$lib/properties';
import type { DerivedSoundingResult } from './derived';

/** One column of the readings table: its header and how a reading's value is written. */
interface ReadingColumn {
	header: string;
	cell: (r: DerivedSoundingResult, i: number) => string;
}

/** Where a reading is: coordinates in the project's length unit to the centimetre, depth and elevation to the millimetre. */
const LOCATION_DECIMALS = { coordinate: 2, depth: 3 } as const;

/**
 * Derived quantities outside the property catalogue ($lib/properties), with their labels, units and the
 * decimals written: about two or three significant figures, for people reading a spreadsheet.
 */
const OTHER_INFO: Record<string, { label: string; unit: string; decimals: number }> = {
	sigmaV: { label: 'σv', unit: 'kPa', decimals: 1 },
	u0: { label: 'u0', unit: 'kPa', decimals: 1 },
	sigmaVeff: { label: 'σ′v', unit: 'kPa', decimals: 1 },
	Fr: { label: 'Fr', unit: '%', decimals: 2 },
	n: { label: 'n', unit: '–', decimals: 3 },
	CN: { label: 'CN', unit: '–', decimals: 3 },
	qc1N: { label: 'qc1N', unit: '–', decimals: 1 }
};

const DERIVED_KEYS = ['qt', 'sigmaV', 'u0', 'sigmaVeff', 'Qtn', 'Fr', 'Ic', 'n', 'FC', 'CN', 'qc1N', 'qc1Ncs', 'CRR', 'Dr', 'su', 'suRatio'] as const;
type DerivedKey = (typeof DERIVED_KEYS)[number];

/** Label, unit and decimals of a quantity: from the property catalogue, else from OTHER_INFO. */
function infoOf(key: DerivedKey | 'qc' | 'fs' | 'u2'): { label: string; unit: string; decimals: number } {
	return key in PROPERTY_INFO ? PROPERTY_INFO[key as PropertyKey] : OTHER_INFO[key];
}

/**
 * The columns of the readings table: the sounding, its location (project length unit), each reading's depth
 * and elevation (m), its unit, the measured qc, fs, u2 (kPa), every derived property with its unit, and the
 * reading's flags (names of $lib/cpt CptFlag, separated by spaces).
 */
function columnsFor(lengthUnit: string): ReadingColumn[] {
	const fixed = (get: (r: DerivedSoundingResult) => number | null, d: number) => (r: DerivedSoundingResult) => roundedCell(get(r), d);
	const measured = (get: (r: DerivedSoundingResult) => ArrayLike<number> | null, d: number) => (r: DerivedSoundingResult, i: number) => {
		const col = get(r);
		return col ? roundedCell(col[i], d) : '';
	};
	return [
		{ header: 'sounding', cell: (r) => field(r.sounding.name) },
		{ header: `easting (${lengthUnit})`, cell: fixed((r) => r.sounding.x, LOCATION_DECIMALS.coordinate) },
		{ header: `northing (${lengthUnit})`, cell: fixed((r) => r.sounding.y, LOCATION_DECIMALS.coordinate) },
		{ header: `chainage (${lengthUnit})`, cell: fixed((r) => r.sounding.chainage, LOCATION_DECIMALS.coordinate) },
		{ header: `ground elevation (${lengthUnit})`, cell: fixed((r) => r.sounding.groundElevation, LOCATION_DECIMALS.coordinate) },
		{ header: 'depth (m)', cell: measured((r) => r.depth, LOCATION_DECIMALS.depth) },
		{ header: 'elevation (m)', cell: measured((r) => r.derived.elevation, LOCATION_DECIMALS.depth) },
		{ header: 'unit', cell: (r, i) => (r.unit[i] >= 0 ? field(r.units[r.unit[i]].name) : '') },
		{ header: labelWithUnit(infoOf('qc')), cell: measured((r) => r.qc, infoOf('qc').decimals) },
		{ header: labelWithUnit(infoOf('fs')), cell: measured((r) => r.fs, infoOf('fs').decimals) },
		{ header: labelWithUnit(infoOf('u2')), cell: measured((r) => r.u2, infoOf('u2').decimals) },
		...DERIVED_KEYS.map((key) => {
			const info = infoOf(key);
			return { header: labelWithUnit(info), cell: measured((r) => r.derived[key], info.decimals) };
		}),
		{ header: 'flags', cell: (r, i) => describeFlags(r.flags[i]).join(' ') }
	];
}

/**
 * The readings of derived soundings as CSV text chunks, one chunk for the header and one per sounding, so a
 * response can stream them. Numbers are rounded for people per quantity (the catalogue's decimals); blank where a value
 * is not defined (NaN).
 */
export function* readingsCsv(results: Iterable<DerivedSoundingResult>, lengthUnit: string): Generator<string> {
	const columns = columnsFor(lengthUnit);
	yield columns.map((c) => field(c.header)).join(',') + '\r\n';
	for (const r of results) {
		const lines: string[] = [];
		for (let i = 0; i < r.depth.length; i++) lines.push(columns.map((c) => c.cell(r, i)).join(','));
		if (lines.length > 0) yield lines.join('\r\n') + '\r\n';
	}
}
