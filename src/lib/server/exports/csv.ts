/**
 * A realization (or an ensemble map) as CSV text, RFC 4180, one row per target: the leading columns (what and where),
 * a column per simulated property, and the transferred parameters. Numbers are written in their shortest round-trip
 * form by default, so parsing the file gives back the regenerated doubles bit for bit, or to `digits` significant
 * digits; blank where a target is not simulated or a column does not apply to its domain.
 */
import { csvField, numberText, significantCell } from '$lib/csv';
import type { SimulatedProperty } from '$lib/properties';
import { headerOf, leadingHeaders, type DomainTransfer, type ExportDomain, type ExportTargets, type OutputColumn } from './table';
import { PROPERTY_INFO } from '$lib/properties';

/**
 * Characters per chunk of text handed to the stream (a chunk ends at the first row end beyond it): chunks of about
 * the same size whatever the width of a row (a 3D mesh with long ids and many transferred parameters writes rows
 * several times wider than a grid), below V8's large-object size (128 KiB), which is freed only by a full collection.
 */
const CHUNK_CHARS = 48 * 1024;

/** A number as the file writes it: shortest round-trip (−0 kept), or `digits` significant digits; blank for NaN. */
export function numberCell(v: number, digits: number | null): string {
	if (v !== v || v === Infinity || v === -Infinity) return '';
	if (digits !== null) return significantCell(v, digits);
	return Object.is(v, -0) ? '-0' : numberText(v);
}

/** Coordinates to 12 significant digits: the grid's arithmetic noise (0.30000000000000004) is not written. */
const coordinate = (v: number) => significantCell(v, 12);

export interface CsvLayout {
	targets: ExportTargets;
	domains: readonly ExportDomain[];
	properties: readonly SimulatedProperty[];
	outputs: readonly OutputColumn[];
	perDomain: readonly DomainTransfer[];
}

/** The property column headers: "qc1Ncs", "su (kPa)". */
export function propertyHeaders(properties: readonly SimulatedProperty[]): string[] {
	return properties.map((p) => headerOf(p, PROPERTY_INFO[p].unit));
}

/** The header line of a realization's CSV. */
export function csvHeader(layout: CsvLayout): string {
	return [...leadingHeaders(layout.targets), ...propertyHeaders(layout.properties), ...layout.outputs.map((o) => o.header)].map(csvField).join(',') + '\r\n';
}

/** The leading cells of target t (without the trailing comma). */
function leading(t: ExportTargets, names: readonly string[], i: number): string {
	const d = t.domain[i];
	const domain = d >= 0 ? names[d] : '';
	const where = t.geometry === '2d' ? `${coordinate(t.x[i])},${coordinate(t.z[i])}` : `${coordinate(t.x[i])},${coordinate(t.y[i])},${coordinate(t.z[i])}`;
	if (t.grid) {
		const { x: nx, y: ny } = t.grid.counts;
		const ix = i % nx;
		const j = Math.floor(i / nx) % ny;
		const k = Math.floor(i / (nx * ny));
		return `${i},${ix},${t.geometry === '3d' ? `${j},` : ''}${k},${where},${domain}`;
	}
	return `${csvField(t.ids!.at(i))},${where},${t.group ? `${csvField(t.group.names[t.group.index[i]])},` : ''}${domain}`;
}

/**
 * The rows of one realization after the header, in chunks of text. `values` holds the realization in target order
 * (NaN where not simulated). Counts values a table held at its ends into the output columns.
 */
export function* csvRows(layout: CsvLayout, values: Float64Array, digits: number | null): Generator<string> {
	const { targets, domains, properties, outputs, perDomain } = layout;
	const names: string[] = [];
	for (const d of domains) names[d.index] = csvField(d.name);
	const column = domains.map(() => -1);
	for (const d of domains) column[d.index] = properties.indexOf(d.property);
	const np = properties.length;
	const no = outputs.length;
	const cells = new Array<string>(np + no);
	const n = values.length;
	let chunk = '';
	for (let i = 0; i < n; i++) {
		const d = targets.domain[i];
		cells.fill('');
		if (d >= 0) {
			const v = values[i];
			cells[column[d]] = numberCell(v, digits);
			for (const { column: c, of } of perDomain[d]) cells[np + c] = numberCell(of(v, i), digits);
		}
		chunk += `${leading(targets, names, i)}${np + no ? ',' : ''}${cells.join(',')}\r\n`;
		if (chunk.length >= CHUNK_CHARS) {
			yield chunk;
			chunk = '';
		}
	}
	if (chunk) yield chunk;
}

/**
 * Ensemble maps as CSV rows: the leading columns, the property each row's values are of, and one column per map.
 */
export function* mapsCsv(
	targets: ExportTargets,
	domains: readonly ExportDomain[],
	maps: readonly { header: string; values: Float64Array }[],
	digits: number | null
): Generator<string> {
	yield [...leadingHeaders(targets), 'property', ...maps.map((m) => m.header)].map(csvField).join(',') + '\r\n';
	const names: string[] = [];
	const props: string[] = [];
	for (const d of domains) {
		names[d.index] = csvField(d.name);
		props[d.index] = headerOf(d.property, PROPERTY_INFO[d.property].unit);
	}
	let chunk = '';
	const n = targets.domain.length;
	for (let i = 0; i < n; i++) {
		const d = targets.domain[i];
		chunk += `${leading(targets, names, i)},${d >= 0 ? csvField(props[d]) : ''}`;
		for (const m of maps) chunk += `,${d >= 0 ? numberCell(m.values[i], digits) : ''}`;
		chunk += '\r\n';
		if (chunk.length >= CHUNK_CHARS) {
			yield chunk;
			chunk = '';
		}
	}
	if (chunk) yield chunk;
}
