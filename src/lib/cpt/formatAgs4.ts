import { checkDecimals, checkSoundings, fixed } from './format';
import type { ParsedSounding } from './types';

/** Options of {@link formatAgs4}. Decimals are counted in the written units (m, MN/m2, kN/m2). */
export interface FormatAgs4Options {
	/** PROJ_ID of the PROJ group; default "CONEFIELD". */
	projectId?: string;
	decimals?: { depth?: number; qc?: number; fs?: number; u2?: number; coordinates?: number };
}

/**
 * Writes soundings as an AGS4 file: PROJ, TRAN, UNIT and TYPE groups, then LOCA (LOCA_ID = sounding id,
 * LOCA_NATE, LOCA_NATN, LOCA_GL in m), SCPG (SCPG_TESN = 1, SCPG_CAR) and SCPT (SCPT_DPTH m, SCPT_RES MN/m2,
 * SCPT_FRES kN/m2, SCPT_PWP2 MN/m2 when any sounding has u2). Every field quoted, CRLF line ends, a blank
 * line between groups. Group and heading names as read by {@link parseAgs4} (from memory of the AGS4
 * dictionary; the TRAN headings likewise). Chainage and extra columns are not written. Default decimals:
 * depth 3, qc 3, fs 1, u2 4, coordinates 2; NaN is written as an empty field.
 *
 * @throws RangeError for unequal column lengths, duplicate ids or bad decimals.
 */
export function formatAgs4(soundings: ParsedSounding[], options: FormatAgs4Options = {}): string {
	const d = options.decimals ?? {};
	const dDepth = checkDecimals(d.depth ?? 3, 'depth');
	const dQc = checkDecimals(d.qc ?? 3, 'qc');
	const dFs = checkDecimals(d.fs ?? 1, 'fs');
	const dU2 = checkDecimals(d.u2 ?? 4, 'u2');
	const dXy = checkDecimals(d.coordinates ?? 2, 'coordinates');
	checkSoundings(soundings);
	const withU2 = soundings.some((s) => s.u2 !== undefined);

	const out: string[] = [];
	const group = (name: string, headings: [string, string, string][], rows: string[][]): void => {
		if (out.length > 0) out.push('');
		out.push(row(['GROUP', name]));
		out.push(row(['HEADING', ...headings.map((h) => h[0])]));
		out.push(row(['UNIT', ...headings.map((h) => h[1])]));
		out.push(row(['TYPE', ...headings.map((h) => h[2])]));
		for (const r of rows) out.push(row(['DATA', ...r]));
	};
	const dp = (n: number): string => `${n}DP`;

	group('PROJ', [['PROJ_ID', '', 'ID']], [[options.projectId ?? 'CONEFIELD']]);
	group('TRAN', [['TRAN_ISNO', '', 'X'], ['TRAN_AGS', '', 'X'], ['TRAN_DLIM', '', 'X'], ['TRAN_RCON', '', 'X']], [['1', '4.1', '|', '+']]);
	const units: [string, string][] = [['m', 'metre'], ['MN/m2', 'meganewton per square metre'], ['kN/m2', 'kilonewton per square metre']];
	group('UNIT', [['UNIT_UNIT', '', 'X'], ['UNIT_DESC', '', 'X']], units.map(([u, desc]) => [u, desc]));
	const types = Array.from(new Set(['ID', 'X', dp(dXy), dp(3), dp(dDepth), dp(dQc), dp(dFs), dp(dU2)]));
	group('TYPE', [['TYPE_TYPE', '', 'X'], ['TYPE_DESC', '', 'X']], types.map((t) => [t, describeType(t)]));

	group(
		'LOCA',
		[['LOCA_ID', '', 'ID'], ['LOCA_NATE', 'm', dp(dXy)], ['LOCA_NATN', 'm', dp(dXy)], ['LOCA_GL', 'm', dp(dXy)]],
		soundings.map((s) => [s.id, opt(s.x, dXy), opt(s.y, dXy), opt(s.groundElevation, dXy)])
	);
	group(
		'SCPG',
		[['LOCA_ID', '', 'ID'], ['SCPG_TESN', '', 'X'], ['SCPG_CAR', '', dp(3)]],
		soundings.map((s) => [s.id, '1', opt(s.areaRatio, 3)])
	);
	const headings: [string, string, string][] = [
		['LOCA_ID', '', 'ID'],
		['SCPG_TESN', '', 'X'],
		['SCPT_DPTH', 'm', dp(dDepth)],
		['SCPT_RES', 'MN/m2', dp(dQc)],
		['SCPT_FRES', 'kN/m2', dp(dFs)]
	];
	if (withU2) headings.push(['SCPT_PWP2', 'MN/m2', dp(dU2)]);
	const rows: string[][] = [];
	for (const s of soundings) {
		for (let i = 0; i < s.depth.length; i++) {
			const r = [s.id, '1', fixed(s.depth[i], dDepth, ''), fixed(s.qc[i] / 1000, dQc, ''), fixed(s.fs[i], dFs, '')];
			if (withU2) r.push(s.u2 ? fixed(s.u2[i] / 1000, dU2, '') : '');
			rows.push(r);
		}
	}
	group('SCPT', headings, rows);
	return out.join('\r\n') + '\r\n';
}

function row(fields: string[]): string {
	return fields.map((f) => `"${f.replace(/[\r\n]+/g, ' ').replace(/"/g, '""')}"`).join(',');
}

function opt(v: number | undefined, decimals: number): string {
	return v === undefined ? '' : fixed(v, decimals, '');
}

function describeType(t: string): string {
	if (t === 'ID') return 'Unique identifier';
	if (t === 'X') return 'Text';
	return `Value; ${t.slice(0, -2)} decimal places`;
}
