// Reads a block of contacts pasted from a spreadsheet (rows: soundings, columns: units) into the edits it asks
// for, so the page can say what was read before anything is saved.
import { parseNumber } from './parse-number';

export interface BlockSounding {
	id: string;
	name: string;
	groundElevation: number;
}
export interface BlockUnit {
	id: string;
	name: string;
}

export interface BlockOptions {
	/** The table's rows in the order shown. */
	soundings: BlockSounding[];
	/** The table's unit columns in the order shown. */
	units: BlockUnit[];
	/** The cell the block was pasted into: row index into `soundings`, column index into `units`. */
	start: { row: number; unit: number };
	/** Stored tops, by `${soundingId}|${unitId}`. */
	current: ReadonlyMap<string, { top: number; interpolated: boolean }>;
	/** The values are depths below the ground surface rather than elevations. */
	asDepths?: boolean;
}

/** One value read from the block and what it would do. */
export interface BlockChange {
	soundingId: string;
	soundingName: string;
	unitId: string;
	unitName: string;
	/** The new top elevation; null: the unit is absent there (an empty cell). */
	top: number | null;
	/** The stored top it replaces (null: none). */
	before: number | null;
}

export interface BlockReading {
	/** Rows and columns of values read (without a header row or a names column). */
	rows: number;
	columns: number;
	/** Rows were matched by the sounding names in the block's first column; columns by unit names in a header row. */
	byName: { soundings: boolean; units: boolean };
	set: BlockChange[];
	remove: BlockChange[];
	unchanged: number;
	/** Header cells that name no unit, and sounding names that are not in the table: left out. */
	ignoredColumns: string[];
	unknownSoundings: string[];
	/** Values beyond the table's last row or column: left out. */
	outside: number;
	/** Cells that are not numbers: nothing is saved while there are any. */
	problems: string[];
}

/** Words a cell may hold for "this unit is absent here", besides an empty cell. */
const ABSENT = /^(-|—|–|absent|none|n\/a|na)$/i;

/**
 * Reads a pasted block. Cells are split by tabs (a spreadsheet's copy), else by semicolons or commas. A first
 * column whose cells are mostly text (not numbers), beside other columns, holds sounding names and places the
 * rows by name; a first row naming units (as "Sand",
 * "Sand top" or "Sand top (m)") places the columns by name and its other columns are left out. Otherwise the
 * block fills the table from the start cell, row by row and column by column. Empty cells and dashes mean
 * the unit is absent; depths are turned into elevations with each sounding's ground elevation.
 */
export function readContactBlock(text: string, o: BlockOptions): BlockReading {
	const lines = text.replace(/\r\n?/g, '\n').replace(/\n+$/, '').split('\n');
	const sep = text.includes('\t') ? '\t' : lines.some((l) => l.includes(';')) ? ';' : ',';
	let grid = lines.map((l) => l.split(sep).map(unquote));
	const key = (s: string) => s.trim().toLowerCase();
	const soundingByName = new Map(o.soundings.map((s, i) => [key(s.name), i]));
	const unitByName = new Map(o.units.map((u, i) => [key(u.name), i]));
	const unitOf = (cell: string) => unitByName.get(key(cell.replace(/\s*\([^)]*\)\s*$/, '').replace(/\s+top$/i, '')));

	const header = grid[0]?.some((c) => unitOf(c) !== undefined) ? grid[0] : null;
	if (header) grid = grid.slice(1);
	// A first column of text (not numbers, not dashes) beside other columns holds sounding names, known or not.
	const width = Math.max(0, ...grid.map((r) => r.length), header?.length ?? 0);
	const firsts = grid.map((r) => (r[0] ?? '').trim()).filter(Boolean);
	const isName = (c: string) => !ABSENT.test(c) && !Number.isFinite(parseNumber(c) ?? NaN);
	const namesColumn = width > 1 && firsts.length > 0 && firsts.filter(isName).length * 2 >= firsts.length;

	const firstValue = namesColumn ? 1 : 0;
	const columnUnits: (number | null)[] = [];
	const ignoredColumns: string[] = [];
	for (let c = firstValue; c < width; c++) {
		if (header) {
			const u = unitOf(header[c] ?? '');
			columnUnits.push(u ?? null);
			if (u === undefined && (header[c] ?? '').trim()) ignoredColumns.push(header[c].trim());
		} else {
			const u = o.start.unit + (c - firstValue);
			columnUnits.push(u < o.units.length ? u : null);
		}
	}

	const out: BlockReading = {
		rows: 0,
		columns: columnUnits.filter((u) => u !== null).length,
		byName: { soundings: namesColumn, units: header !== null },
		set: [],
		remove: [],
		unchanged: 0,
		ignoredColumns,
		unknownSoundings: [],
		outside: 0,
		problems: []
	};
	grid.forEach((row, r) => {
		let si: number | undefined;
		if (namesColumn) {
			si = soundingByName.get(key(row[0] ?? ''));
			if (si === undefined) {
				if ((row[0] ?? '').trim()) out.unknownSoundings.push(row[0].trim());
				return;
			}
		} else {
			si = o.start.row + r;
			if (si >= o.soundings.length) {
				out.outside += row.filter((c) => c.trim()).length;
				return;
			}
		}
		out.rows++;
		const s = o.soundings[si];
		columnUnits.forEach((ui, k) => {
			const cell = row[firstValue + k] ?? '';
			if (ui === null) {
				if (!header && cell.trim()) out.outside++;
				return;
			}
			const u = o.units[ui];
			const v = ABSENT.test(cell.trim()) ? null : parseNumber(cell);
			if (v !== null && !Number.isFinite(v)) {
				out.problems.push(`${s.name}, ${u.name}: “${cell.trim()}” is not a number.`);
				return;
			}
			const top = v === null ? null : o.asDepths ? round(s.groundElevation - v) : v;
			const stored = o.current.get(`${s.id}|${u.id}`);
			const change: BlockChange = { soundingId: s.id, soundingName: s.name, unitId: u.id, unitName: u.name, top, before: stored?.top ?? null };
			if (top === null) {
				if (stored) out.remove.push(change);
				else out.unchanged++;
			} else if (stored && stored.top === top && !stored.interpolated) out.unchanged++;
			else out.set.push(change);
		});
	});
	return out;
}

/** What a reading will do, in a sentence or two, for the preview before saving. */
export function describeReading(r: BlockReading): string {
	const n = (k: number, one: string, many = `${one}s`) => `${k} ${k === 1 ? one : many}`;
	const placed = [r.byName.soundings ? 'rows by sounding name' : 'rows from the cell pasted into', r.byName.units ? 'columns by unit name' : 'columns in table order'];
	const parts = [`Read ${n(r.rows, 'sounding')} × ${n(r.columns, 'unit')} (${placed.join(', ')}).`];
	const what = [`${n(r.set.length, 'top')} to set`];
	if (r.remove.length) what.push(`${n(r.remove.length, 'contact')} to remove (empty cells: the unit is absent there)`);
	if (r.unchanged) what.push(`${r.unchanged} unchanged`);
	parts.push(`${what.join(', ')}.`);
	if (r.ignoredColumns.length) parts.push(`Left out the ${r.ignoredColumns.length === 1 ? 'column' : 'columns'} ${r.ignoredColumns.map((c) => `“${c}”`).join(', ')}.`);
	if (r.unknownSoundings.length) parts.push(`Not in this project, left out: ${r.unknownSoundings.join(', ')}.`);
	if (r.outside) parts.push(`${n(r.outside, 'value')} beyond the table's last row or column, left out.`);
	return parts.join(' ');
}

function unquote(cell: string): string {
	const t = cell.trim();
	return t.length >= 2 && t.startsWith('"') && t.endsWith('"') ? t.slice(1, -1).replace(/""/g, '"') : cell;
}

/** Millimetres: a depth turned into an elevation keeps no binary noise. */
function round(v: number): number {
	return Math.round(v * 1000) / 1000;
}
