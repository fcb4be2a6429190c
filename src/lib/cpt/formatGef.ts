import { checkColumns, checkDecimals, fixed, oneLine } from './format';
import { GEF_MEASUREMENTVAR_AREA_RATIO, GEF_QUANTITY } from './parseGef';
import type { ParsedSounding } from './types';

/** Options of {@link formatGef}. Decimals are counted in the written units (m and MPa). */
export interface FormatGefOptions {
	decimals?: { depth?: number; qc?: number; fs?: number; u2?: number; coordinates?: number };
	/** Column separator (#COLUMNSEPARATOR); default whitespace, written without the keyword. */
	columnSeparator?: string;
	/** Record separator (#RECORDSEPARATOR) ending each data line; default none. */
	recordSeparator?: string;
}

/** Void value written for missing readings. */
const VOID = -9999;

/**
 * Writes one sounding as a GEF CPT file: depth as penetration length in m, qc, fs and u2 in MPa, with
 * #XYID (coordinate system code 0, our choice for "unspecified"), #ZID, the net area quotient as
 * #MEASUREMENTVAR 3 and void value −9999 for NaN. Keywords as read by {@link parseGef} (from memory of the
 * GEF-CPT report). Chainage and extra columns are not written. Default decimals: depth 3, qc 4, fs 5, u2 5,
 * coordinates 3.
 *
 * @throws RangeError for unequal column lengths or bad decimals; TypeError for separators that clash with numbers.
 */
export function formatGef(s: ParsedSounding, options: FormatGefOptions = {}): string {
	const d = options.decimals ?? {};
	const dDepth = checkDecimals(d.depth ?? 3, 'depth');
	const dQc = checkDecimals(d.qc ?? 4, 'qc');
	const dFs = checkDecimals(d.fs ?? 5, 'fs');
	const dU2 = checkDecimals(d.u2 ?? 5, 'u2');
	const dXy = checkDecimals(d.coordinates ?? 3, 'coordinates');
	checkColumns(s);
	const n = s.depth.length;
	const { columnSeparator, recordSeparator } = options;
	for (const sep of [columnSeparator, recordSeparator]) {
		if (sep !== undefined && (sep === '' || /[0-9.eE+\-#\r\n]/.test(sep))) throw new TypeError('separator must not be empty or part of a number');
	}

	const columns: [string, string, number][] = [
		['m', 'penetration length', GEF_QUANTITY.penetrationLength],
		['MPa', 'cone resistance', GEF_QUANTITY.coneResistance],
		['MPa', 'local friction', GEF_QUANTITY.localFriction]
	];
	if (s.u2) columns.push(['MPa', 'pore pressure u2', GEF_QUANTITY.porePressureU2]);
	const out: string[] = ['#GEFID= 1, 1, 0', '#FILEOWNER= Conefield', `#TESTID= ${oneLine(s.id)}`, `#COLUMN= ${columns.length}`];
	columns.forEach(([unit, name, q], k) => out.push(`#COLUMNINFO= ${k + 1}, ${unit}, ${name}, ${q}`));
	for (let k = 2; k <= columns.length; k++) out.push(`#COLUMNVOID= ${k}, ${VOID}`);
	if (columnSeparator !== undefined) out.push(`#COLUMNSEPARATOR= ${columnSeparator}`);
	if (recordSeparator !== undefined) out.push(`#RECORDSEPARATOR= ${recordSeparator}`);
	if (s.x !== undefined && s.y !== undefined) out.push(`#XYID= 0, ${fixed(s.x, dXy, '0')}, ${fixed(s.y, dXy, '0')}, 0, 0`);
	if (s.groundElevation !== undefined) out.push(`#ZID= 0, ${fixed(s.groundElevation, dXy, '0')}, 0`);
	if (s.areaRatio !== undefined) {
		out.push(`#MEASUREMENTVAR= ${GEF_MEASUREMENTVAR_AREA_RATIO}, ${s.areaRatio}, -, net area quotient of the cone tip`);
	}
	out.push('#EOH=');

	const sep = columnSeparator ?? ' ';
	const end = recordSeparator ?? '';
	const voidText = String(VOID);
	for (let i = 0; i < n; i++) {
		const cells = [
			fixed(s.depth[i], dDepth, voidText),
			fixed(s.qc[i] / 1000, dQc, voidText),
			fixed(s.fs[i] / 1000, dFs, voidText)
		];
		if (s.u2) cells.push(fixed(s.u2[i] / 1000, dU2, voidText));
		out.push(cells.join(sep) + end);
	}
	return out.join('\n') + '\n';
}
