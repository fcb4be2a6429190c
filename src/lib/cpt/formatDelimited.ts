import type { Delimiter } from './delimitedText';
import { checkDecimals, checkSoundings, fixed } from './format';
import type { ParsedSounding } from './types';

/** Options of {@link formatDelimited}. Decimals are counted in the written units (m, MPa, kPa). */
export interface FormatDelimitedOptions {
	/** Default ','. */
	delimiter?: Delimiter;
	decimals?: { depth?: number; qc?: number; fs?: number; u2?: number; coordinates?: number };
}

/**
 * Writes soundings as delimited text with a header row, one row per reading:
 * "sounding, depth (m), qc (MPa), fs (kPa)", then "u2 (kPa)", "easting (m)", "northing (m)", "chainage (m)",
 * "ground elevation (m)" and "area ratio" when any sounding has them, repeated on every row. The header is
 * what {@link previewDelimited} recognises, so its guess maps the file back completely. Extra columns are not
 * written. Default decimals: depth 3, qc 4, fs 2, u2 2, coordinates 3; NaN is an empty cell. Fields holding
 * the delimiter or a quote are quoted.
 *
 * @throws RangeError for unequal column lengths, duplicate ids or bad decimals.
 */
export function formatDelimited(soundings: ParsedSounding[], options: FormatDelimitedOptions = {}): string {
	const delimiter = options.delimiter ?? ',';
	if (delimiter !== ',' && delimiter !== ';' && delimiter !== '\t') throw new RangeError('delimiter must be comma, semicolon or tab');
	const d = options.decimals ?? {};
	const dDepth = checkDecimals(d.depth ?? 3, 'depth');
	const dQc = checkDecimals(d.qc ?? 4, 'qc');
	const dFs = checkDecimals(d.fs ?? 2, 'fs');
	const dU2 = checkDecimals(d.u2 ?? 2, 'u2');
	const dXy = checkDecimals(d.coordinates ?? 3, 'coordinates');
	checkSoundings(soundings);
	const any = (f: (s: ParsedSounding) => unknown): boolean => soundings.some((s) => f(s) !== undefined);
	const optional: { header: string; cell: (s: ParsedSounding, i: number) => string }[] = [];
	if (any((s) => s.u2)) optional.push({ header: 'u2 (kPa)', cell: (s, i) => (s.u2 ? fixed(s.u2[i], dU2, '') : '') });
	const perSounding = [
		['x', 'easting (m)'],
		['y', 'northing (m)'],
		['chainage', 'chainage (m)'],
		['groundElevation', 'ground elevation (m)']
	] as const;
	for (const [key, header] of perSounding) {
		if (any((s) => s[key])) optional.push({ header, cell: (s) => (s[key] === undefined ? '' : fixed(s[key]!, dXy, '')) });
	}
	if (any((s) => s.areaRatio)) optional.push({ header: 'area ratio', cell: (s) => (s.areaRatio === undefined ? '' : String(s.areaRatio)) });

	const quote = (f: string): string => (f.includes(delimiter) || f.includes('"') ? `"${f.replace(/"/g, '""')}"` : f);
	const out: string[] = [['sounding', 'depth (m)', 'qc (MPa)', 'fs (kPa)', ...optional.map((o) => o.header)].join(delimiter)];
	for (const s of soundings) {
		const id = quote(s.id.replace(/[\r\n]+/g, ' '));
		for (let i = 0; i < s.depth.length; i++) {
			const cells = [id, fixed(s.depth[i], dDepth, ''), fixed(s.qc[i] / 1000, dQc, ''), fixed(s.fs[i], dFs, '')];
			for (const o of optional) cells.push(o.cell(s, i));
			out.push(cells.join(delimiter));
		}
	}
	return out.join('\n') + '\n';
}
