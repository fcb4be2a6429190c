import { describe, expect, it } from 'vitest';
import { FT_TO_M, TSF_TO_KPA, parseDelimited, previewDelimited } from '$lib/cpt';
import type { DelimitedMapping } from '$lib/cpt';
import { expectAbsClose, expectAllAbsClose, expectAllAbsCloseOrNaN } from '../asserts';
import { expectParseError } from './expectParseError';


const CSV = [
	'sounding,depth,qc,fs,u2,easting,northing,gl',
	'A,0.5,1.20,10,5,100,200,3.0',
	'A,1.0,1.50,,8,100,200,3.0',
	'B,0.5,2.00,20,NaN,150,210,2.5',
	'A,1.5,1.80,15,12,100,200,3.0',
	'B,1.0,2.50,25,-,150,210,2.5'
].join('\n');
const MAPPING: DelimitedMapping = {
	id: 'sounding',
	depth: 'depth',
	qc: 'qc',
	fs: 'fs',
	u2: 'u2',
	units: { depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' },
	x: { column: 'easting' },
	y: { column: 'northing' },
	groundElevation: { column: 'gl' }
};

describe('parseDelimited(text, mapping)', () => {
	it('parseDelimited(text, mapping) splits soundings by the id column and converts to kPa', () => {
		const [a, b] = parseDelimited(CSV, MAPPING);
		expect(a.id).toBe('A');
		expectAllAbsClose(a.depth, [0.5, 1, 1.5], 1e-12, 'depth');
		expectAllAbsClose(a.qc, [1200, 1500, 1800], 1e-9, 'qc');
		expectAllAbsCloseOrNaN(a.fs, [10, NaN, 15], 0, 'fs');
		expectAllAbsClose(a.u2!, [5, 8, 12], 0, 'u2');
		expect([a.x, a.y, a.groundElevation]).toEqual([100, 200, 3]);
		expect(a.areaRatio).toBe(0.8);
		expect(b.id).toBe('B');
		expectAllAbsCloseOrNaN(b.u2!, [NaN, NaN], 0, 'u2');
		expect(b.groundElevation).toBe(2.5);
	});

	it('parseDelimited(text, mapping) applies exact ft and tsf factors (1 ft = 0.3048 m, 1 tsf = 2000 lbf/ft²)', () => {
		// 1 tsf = 2000 × 0.45359237 kg × 9.80665 m/s² / 0.3048² m² = 95.760 518 kPa (NIST SP 811 definitions).
		expectAbsClose(TSF_TO_KPA, 95.760518, 1e-6);
		expect(FT_TO_M).toBe(0.3048);
		const text = 'depth_ft\tqc_tsf\tfs_tsf\tu2_tsf\n10\t100\t1\t0.5\n20\t120\t1.2\t0.7\n';
		const [s] = parseDelimited(
			text,
			{ depth: 'depth_ft', qc: 'qc_tsf', fs: 'fs_tsf', u2: 'u2_tsf', units: { depth: 'ft', qc: 'tsf', fs: 'tsf', u2: 'tsf', coordinates: 'ft' }, x: { value: 1000 }, chainage: { value: 50 } },
			{ file: 'old/CPT-9.txt' }
		);
		expect(s.id).toBe('CPT-9');
		expectAllAbsClose(s.depth, [3.048, 6.096], 1e-12, 'depth');
		expectAllAbsClose(s.qc, [100 * TSF_TO_KPA, 120 * TSF_TO_KPA], 1e-9, 'qc');
		expectAllAbsClose(s.u2!, [0.5 * TSF_TO_KPA, 0.7 * TSF_TO_KPA], 1e-12, 'u2');
		expectAbsClose(s.x!, 304.8, 1e-9);
		expectAbsClose(s.chainage!, 15.24, 1e-12);
	});

	it('parseDelimited(text, mapping) detects semicolons with decimal commas, quoted cells and CRLF', () => {
		const text = '"Sounding";"Depth";"qc";"fs";"a"\r\n"S 1";0,5;1,25;12,5;0,75\r\n"S 1";1,0;1,5;13;0,75\r\n';
		const [s] = parseDelimited(text, { id: 'Sounding', depth: 'Depth', qc: 'qc', fs: 'fs', units: { depth: 'm', qc: 'MPa', fs: 'kPa' }, areaRatio: { column: 'a' } });
		expect(s.id).toBe('S 1');
		expectAllAbsClose(s.qc, [1250, 1500], 1e-9, 'qc');
		expectAllAbsClose(s.fs, [12.5, 13], 1e-12, 'fs');
		expect(s.areaRatio).toBe(0.75);
		expect(s.u2).toBeUndefined();
	});

	it('parseDelimited(text, mapping) honours a spreadsheet "sep=" line and reads a one-row file', () => {
		const text = 'sep=;\ndepth;qc;fs\n2,5;1,5;12\n';
		const [s] = parseDelimited(text, { depth: 'depth', qc: 'qc', fs: 'fs', units: { depth: 'm', qc: 'MPa', fs: 'kPa' } });
		expectAllAbsClose(s.depth, [2.5], 1e-12, 'depth');
		expectAllAbsClose(s.qc, [1500], 1e-9, 'qc');
		const p = previewDelimited('sep=\t\n\ndepth\tqc\tfs\n1\t2\t3\n');
		expect(p.delimiter).toBe('\t');
		expect(p.headers).toEqual(['depth', 'qc', 'fs']);
		expectParseError(() => previewDelimited('sep=,\n'), 'malformed', 1);
	});

	it('parseDelimited(text, mapping) keeps extra columns and takes the default id', () => {
		const text = 'z,qc,fs,FC\n1,2,20,15\n2,3,30,\n';
		const [s] = parseDelimited(text, { depth: 'z', qc: 'qc', fs: 'fs', extra: ['FC'], defaultId: 'X1', units: { depth: 'm', qc: 'MPa', fs: 'kPa' } });
		expect(s.id).toBe('X1');
		expectAllAbsCloseOrNaN(s.extra!.FC, [15, NaN], 0, 'FC');
	});

	it('parseDelimited(text, mapping) names line and column for a non-numeric cell', () => {
		const rows = ['depth,qc,fs'];
		for (let i = 1; i <= 15; i++) rows.push(`${i},1,10`);
		rows.push('16,abc,10');
		const err = expectParseError(() => parseDelimited(rows.join('\n'), { depth: 'depth', qc: 'qc', fs: 'fs', units: { depth: 'm', qc: 'MPa', fs: 'kPa' } }), 'not-a-number', 17, 'qc');
		expect(err.message).toBe("line 17, column qc: 'abc' is not a number");
	});

	it('parseDelimited(text, mapping) rejects a missing column, unknown units and depths that do not increase', () => {
		expectParseError(() => parseDelimited(CSV, { ...MAPPING, fs: 'sleeve' }, { file: 'f.csv' }), 'missing-column', 1, 'sleeve');
		expectParseError(() => parseDelimited(CSV, { ...MAPPING, units: { ...MAPPING.units, qc: 'bar' as 'MPa' } }), 'unknown-unit', undefined, 'qc');
		expectParseError(() => parseDelimited(CSV, { ...MAPPING, units: { ...MAPPING.units, depth: 'yd' as 'm' } }), 'unknown-unit', undefined, 'depth');
		const bad = CSV.replace('A,1.5,1.80', 'A,0.9,1.80');
		expectParseError(() => parseDelimited(bad, MAPPING), 'depth-not-increasing', 5, 'depth');
		expectParseError(() => parseDelimited(CSV.replace('A,1.0,1.50', 'A,,1.50'), MAPPING), 'missing-value', 3, 'depth');
		expectParseError(() => parseDelimited(CSV.replace('A,0.5,1.20', 'A,-0.5,1.20'), MAPPING), 'malformed', 2, 'depth');
		expectParseError(() => parseDelimited(CSV.replace('B,0.5', ',0.5'), MAPPING), 'missing-value', 4, 'sounding');
	});

	it('parseDelimited(text, mapping) says a file probably holds several soundings where depths restart, naming the id column', () => {
		const text = [
			'Project;PointID;Z (m NAP);depth;qc;fs',
			'Dike;DKM-01;-1,25;0,02;0,5;5',
			'Dike;DKM-01;-1,25;0,04;0,6;6',
			'Dike;DKM-01;-1,25;0,06;0,7;7',
			'Dike;DKM-02;-0,90;0,02;0,4;4'
		].join('\n');
		const oneSounding: DelimitedMapping = { depth: 'depth', qc: 'qc', fs: 'fs', units: { depth: 'm', qc: 'MPa', fs: 'kPa' }, groundElevation: { value: 0 } };
		const err = expectParseError(() => parseDelimited(text, oneSounding, { file: 'dike.csv' }), 'depth-not-increasing', 5, 'depth');
		expect(err.message).toBe(
			"dike.csv: line 5, column depth: depth restarts at 0.02 m after 0.06 m with no sounding id column chosen: the file probably holds " +
				"several soundings; choose the column that names them as the sounding id; columns that change here: 'PointID', 'Z (m NAP)'"
		);
		// An id column that does not tell the soundings apart gets the same diagnosis, naming the better column.
		const wrongId = expectParseError(() => parseDelimited(text, { ...oneSounding, id: 'Project' }), 'depth-not-increasing', 5, 'depth');
		expect(wrongId.detail).toContain("within sounding Dike (column 'Project'): the file probably holds several soundings");
		expect(wrongId.detail).toContain("columns that change here: 'PointID'");
		// With the right id column the same file reads as two soundings.
		expect(parseDelimited(text, { ...oneSounding, id: 'PointID' }).map((s) => [s.id, s.depth.length])).toEqual([
			['DKM-01', 3],
			['DKM-02', 1]
		]);
		// A small step back is a recording error, not a restart: the plain message stays.
		const step = expectParseError(() => parseDelimited(text.replace('DKM-02;-0,90;0,02', 'DKM-01;-1,25;0,05'), oneSounding), 'depth-not-increasing', 5, 'depth');
		expect(step.detail).toBe('depth 0.05 m does not increase from 0.06 m');
	});

	it('parseDelimited(text, mapping) rejects malformed rows and files', () => {
		expectParseError(() => parseDelimited(CSV.replace('A,1.0,1.50,,8', 'A,1.0,1.50,8'), MAPPING), 'malformed', 3);
		expectParseError(() => parseDelimited('depth qc fs\n1 2 3', MAPPING), 'malformed', 1);
		expectParseError(() => parseDelimited(CSV.split('\n')[0], MAPPING), 'malformed', 1);
		expectParseError(() => parseDelimited('depth,depth,qc,fs\n1,1,1,1', MAPPING), 'malformed', 1, 'depth');
		expectParseError(() => parseDelimited(CSV.replace('100,200,3.0', '100,200,"3.0'), MAPPING), 'malformed', 2);
		expectParseError(() => parseDelimited(CSV, { ...MAPPING, areaRatio: { column: 'gl' } }), 'malformed', 2, 'gl');
		expectParseError(() => parseDelimited('', MAPPING), 'empty-file', 1);
		expectParseError(() => parseDelimited('a,b\n\u0000', MAPPING), 'binary-file', 2);
	});
});
