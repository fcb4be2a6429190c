// The column-mapping step's form state for one delimited file, and its translation to the parser's mapping.
import type { DelimitedMapping, DelimitedMappingGuess, DelimitedPreview } from '$lib/cpt';

export type LocationMode = 'xy-columns' | 'xy-values' | 'chainage-column' | 'chainage-value' | 'none';
export type SourceMode = 'column' | 'value';

export interface MappingForm {
	id: string;
	defaultId: string;
	depth: string;
	qc: string;
	fs: string;
	u2: string;
	extra: string[];
	units: { depth: 'm' | 'ft'; qc: 'MPa' | 'kPa' | 'tsf'; fs: 'MPa' | 'kPa' | 'tsf'; u2: 'MPa' | 'kPa' | 'tsf'; coordinates: 'm' | 'ft' };
	location: LocationMode;
	xColumn: string;
	yColumn: string;
	xValue: number | null;
	yValue: number | null;
	chainageColumn: string;
	chainageValue: number | null;
	ground: SourceMode;
	groundColumn: string;
	groundValue: number | null;
	area: SourceMode;
	areaColumn: string;
	areaValue: number;
}

const columnOf = (v: DelimitedMappingGuess['x']): string => (v && 'column' in v ? v.column : '');

/** The form as the preview's guess fills it; a person confirms it before anything is imported. */
export function formFromGuess(preview: DelimitedPreview, fileName: string): MappingForm {
	const g = preview.guess;
	const location: LocationMode = g.x && g.y ? 'xy-columns' : g.chainage ? 'chainage-column' : 'none';
	return {
		id: g.id ?? '',
		defaultId: fileName.replace(/\.[^.]+$/, ''),
		depth: g.depth ?? '',
		qc: g.qc ?? '',
		fs: g.fs ?? '',
		u2: g.u2 ?? '',
		extra: [],
		units: { depth: g.units.depth, qc: g.units.qc, fs: g.units.fs, u2: g.units.u2 ?? 'kPa', coordinates: g.units.coordinates ?? 'm' },
		location,
		xColumn: columnOf(g.x),
		yColumn: columnOf(g.y),
		xValue: null,
		yValue: null,
		chainageColumn: columnOf(g.chainage),
		chainageValue: null,
		ground: g.groundElevation ? 'column' : 'value',
		groundColumn: columnOf(g.groundElevation),
		groundValue: null,
		area: g.areaRatio && 'column' in g.areaRatio ? 'column' : 'value',
		areaColumn: columnOf(g.areaRatio),
		areaValue: 0.8
	};
}

/** What is still missing before the file can be imported; empty when the mapping is complete. */
export function mappingProblems(f: MappingForm): string[] {
	const out: string[] = [];
	if (!f.depth) out.push('Choose the depth column.');
	if (!f.qc) out.push('Choose the qc column.');
	if (!f.fs) out.push('Choose the fs column.');
	if (!f.id && !f.defaultId.trim()) out.push('Name the sounding or choose an id column.');
	if (f.location === 'xy-columns' && (!f.xColumn || !f.yColumn)) out.push('Choose the easting and northing columns.');
	if (f.location === 'xy-values' && (f.xValue === null || f.yValue === null)) out.push('Enter the easting and northing.');
	if (f.location === 'chainage-column' && !f.chainageColumn) out.push('Choose the chainage column.');
	if (f.location === 'chainage-value' && f.chainageValue === null) out.push('Enter the chainage.');
	if (f.ground === 'column' && !f.groundColumn) out.push('Choose the ground elevation column.');
	if (f.ground === 'value' && (f.groundValue === null || !Number.isFinite(f.groundValue))) out.push('Enter the ground elevation.');
	if (f.area === 'column' && !f.areaColumn) out.push('Choose the area ratio column.');
	if (f.area === 'value' && !(f.areaValue >= 0 && f.areaValue <= 1)) out.push('The area ratio is within 0–1.');
	return out;
}

/** The parser's mapping for a complete form. */
export function mappingOf(f: MappingForm, preview: DelimitedPreview): DelimitedMapping {
	const m: DelimitedMapping = {
		delimiter: preview.delimiter,
		depth: f.depth,
		qc: f.qc,
		fs: f.fs,
		units: { depth: f.units.depth, qc: f.units.qc, fs: f.units.fs, coordinates: f.units.coordinates }
	};
	if (f.id) m.id = f.id;
	else m.defaultId = f.defaultId.trim();
	if (f.u2) {
		m.u2 = f.u2;
		m.units.u2 = f.units.u2;
	}
	if (f.extra.length > 0) m.extra = [...f.extra];
	if (f.location === 'xy-columns') {
		m.x = { column: f.xColumn };
		m.y = { column: f.yColumn };
	} else if (f.location === 'xy-values') {
		m.x = { value: f.xValue! };
		m.y = { value: f.yValue! };
	} else if (f.location === 'chainage-column') m.chainage = { column: f.chainageColumn };
	else if (f.location === 'chainage-value') m.chainage = { value: f.chainageValue! };
	m.groundElevation = f.ground === 'column' ? { column: f.groundColumn } : { value: f.groundValue! };
	m.areaRatio = f.area === 'column' ? { column: f.areaColumn } : { value: f.areaValue };
	return m;
}

/** The role a header plays in the form, for the preview table's column tags. */
export function roleOf(f: MappingForm, header: string): string | null {
	if (header === f.id) return 'sounding id';
	if (header === f.depth) return `depth · ${f.units.depth}`;
	if (header === f.qc) return `qc · ${f.units.qc}`;
	if (header === f.fs) return `fs · ${f.units.fs}`;
	if (header === f.u2) return `u2 · ${f.units.u2}`;
	if (f.location === 'xy-columns' && header === f.xColumn) return `easting · ${f.units.coordinates}`;
	if (f.location === 'xy-columns' && header === f.yColumn) return `northing · ${f.units.coordinates}`;
	if (f.location === 'chainage-column' && header === f.chainageColumn) return `chainage · ${f.units.coordinates}`;
	if (f.ground === 'column' && header === f.groundColumn) return `ground elevation · ${f.units.coordinates}`;
	if (f.area === 'column' && header === f.areaColumn) return 'area ratio';
	if (f.extra.includes(header)) return 'extra (kept as is)';
	return null;
}
