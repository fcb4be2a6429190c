import { describeFlags } from '$lib/cpt';
import { SECTION_PROPERTY_INFO, type SectionProperty } from '$lib/schemas/stratigraphy';
import type { DerivedSoundingResult } from './derived';

/** One column of the readings table: its header and how a reading's value is written. */
interface ReadingColumn {
	header: string;
	cell: (r: DerivedSoundingResult, i: number) => string;
}

/**
 * Decimals written per quantity, chosen for people reading a spreadsheet: about the resolution of a CPT
 * reading (1 kPa on qc, 0.1 kPa on fs and u2, 1 mm on depth) and two or three significant figures on the
 * dimensionless ones. This table and the labels of SECTION_PROPERTY_INFO are the one place the CSV takes them
 * from, to be replaced by the project's property catalogue.
 */
const DECIMALS = {
	coordinate: 2,
	depth: 3,
	qc: 0,
	fs: 1,
	u2: 1,
	qt: 0,
	sigmaV: 1,
	u0: 1,
	sigmaVeff: 1,
	Qtn: 1,
	Fr: 2,
	Ic: 2,
	n: 3,
	FC: 1,
	CN: 3,
	qc1N: 1,
	qc1Ncs: 1,
	CRR: 3,
	Dr: 2,
	su: 1,
	suRatio: 3
} as const;

/** Derived quantities that are not in SECTION_PROPERTY_INFO, with their labels and units. */
const OTHER_INFO: Record<string, { label: string; unit: string }> = {
	sigmaV: { label: 'σv', unit: 'kPa' },
	u0: { label: 'u0', unit: 'kPa' },
	sigmaVeff: { label: 'σ′v', unit: 'kPa' },
	Fr: { label: 'Fr', unit: '%' },
	n: { label: 'n', unit: '–' },
	CN: { label: 'CN', unit: '–' },
	qc1N: { label: 'qc1N', unit: '–' }
};

const DERIVED_KEYS = ['qt', 'sigmaV', 'u0', 'sigmaVeff', 'Qtn', 'Fr', 'Ic', 'n', 'FC', 'CN', 'qc1N', 'qc1Ncs', 'CRR', 'Dr', 'su', 'suRatio'] as const;
type DerivedKey = (typeof DERIVED_KEYS)[number];

/** A number rounded for people: fixed decimals, no "-0", blank for NaN or infinity. */
export function roundedCell(v: number | null | undefined, decimals: number): string {
	if (v === null || v === undefined || !Number.isFinite(v)) return '';
	const s = v.toFixed(decimals);
	return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

function headerOf(label: string, unit: string): string {
	return unit === '–' || unit === '' ? label : `${label} (${unit})`;
}

function infoOf(key: DerivedKey): { label: string; unit: string } {
	return (SECTION_PROPERTY_INFO as Record<string, { label: string; unit: string }>)[key as SectionProperty] ?? OTHER_INFO[key];
}

/** RFC 4180: a field with a comma, quote or line break is quoted, quotes doubled. */
function field(s: string): string {
	return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
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
		{ header: `easting (${lengthUnit})`, cell: fixed((r) => r.sounding.x, DECIMALS.coordinate) },
		{ header: `northing (${lengthUnit})`, cell: fixed((r) => r.sounding.y, DECIMALS.coordinate) },
		{ header: `chainage (${lengthUnit})`, cell: fixed((r) => r.sounding.chainage, DECIMALS.coordinate) },
		{ header: `ground elevation (${lengthUnit})`, cell: fixed((r) => r.sounding.groundElevation, DECIMALS.coordinate) },
		{ header: 'depth (m)', cell: measured((r) => r.depth, DECIMALS.depth) },
		{ header: 'elevation (m)', cell: measured((r) => r.derived.elevation, DECIMALS.depth) },
		{ header: 'unit', cell: (r, i) => (r.unit[i] >= 0 ? field(r.units[r.unit[i]].name) : '') },
		{ header: 'qc (kPa)', cell: measured((r) => r.qc, DECIMALS.qc) },
		{ header: 'fs (kPa)', cell: measured((r) => r.fs, DECIMALS.fs) },
		{ header: 'u2 (kPa)', cell: measured((r) => r.u2, DECIMALS.u2) },
		...DERIVED_KEYS.map((key) => {
			const { label, unit } = infoOf(key);
			return { header: headerOf(label, unit), cell: measured((r) => r.derived[key], DECIMALS[key]) };
		}),
		{ header: 'flags', cell: (r, i) => describeFlags(r.flags[i]).join(' ') }
	];
}

/**
 * The readings of derived soundings as CSV text chunks, one chunk for the header and one per sounding, so a
 * response can stream them. Numbers are rounded for people per quantity (see DECIMALS); blank where a value
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
