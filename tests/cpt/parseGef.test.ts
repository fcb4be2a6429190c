import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MAX_FILE_BYTES, parseGef } from '$lib/cpt';
import { expectAbsClose, expectAllAbsClose, expectAllAbsCloseOrNaN } from '../asserts';
import { expectParseError } from './expectParseError';

// A hand-written GEF CPT file (keywords from memory of the GEF-CPT report, see REFERENCES.md): semicolon
// columns, "!" record ends, qc in MPa, fs in kPa, u2 in MPa, corrected depth beside penetration length.
const HEADER = [
	'#GEFID= 1, 1, 0',
	'#FILEOWNER= Example Lab',
	'#TESTID= CPT-07',
	'#COLUMN= 5',
	'#COLUMNINFO= 1, m, penetration length, 1',
	'#COLUMNINFO= 2, MPa, cone resistance, 2',
	'#COLUMNINFO= 3, kPa, local friction, 3',
	'#COLUMNINFO= 4, MPa, pore pressure u2, 6',
	'#COLUMNINFO= 5, m, corrected depth, 11',
	'#COLUMNVOID= 2, -9999.0',
	'#COLUMNVOID= 3, -9999.0',
	'#COLUMNVOID= 4, -9999.0',
	'#COLUMNSEPARATOR= ;',
	'#RECORDSEPARATOR= !',
	'#XYID= 31000, 155000.00, 463000.00, 0.01, 0.01',
	'#ZID= 31000, -1.25, 0.01',
	'#MEASUREMENTVAR= 3, 0.75, -, net area quotient of the cone tip',
	'#EOH='
];
const DATA = ['0.020;0.512;5.1;0.0012;0.020;!', '0.040;0.530;-9999.0;0.0020;0.039;!', '0.060;-9999.0;6.0;0.0031;0.059;!'];
const GEF = [...HEADER, ...DATA].join('\r\n') + '\r\n';


describe('parseGef(text)', () => {
	it('parseGef(text) reads columns by quantity number and converts declared units to m and kPa', () => {
		const [s] = parseGef(GEF);
		expect(s.id).toBe('CPT-07');
		// Corrected depth (quantity 11) takes precedence over penetration length (1).
		expectAllAbsClose(s.depth, [0.02, 0.039, 0.059], 1e-12, 'depth');
		expectAllAbsCloseOrNaN(s.qc, [512, 530, NaN], 1e-9, 'qc');
		expectAllAbsCloseOrNaN(s.fs, [5.1, NaN, 6], 1e-12, 'fs');
		expectAllAbsClose(s.u2!, [1.2, 2.0, 3.1], 1e-9, 'u2');
		expect(s.x).toBe(155000);
		expect(s.y).toBe(463000);
		expect(s.groundElevation).toBe(-1.25);
		expect(s.areaRatio).toBe(0.75);
		expectAllAbsClose(s.extra!['penetration length'], [0.02, 0.04, 0.06], 1e-12, 'extra');
		expect(s.meta?.TESTID).toBe('CPT-07');
		expect(s.depth).toBeInstanceOf(Float64Array);
	});

	it('parseGef(text) reads whitespace columns, kPa cone resistance, cm depth and fs from the friction ratio', () => {
		const text = [
			'#GEFID= 1, 1, 0',
			'#COLUMN= 3',
			'#COLUMNINFO= 1, cm, penetration length, 1',
			'#COLUMNINFO= 2, kPa, cone resistance, 2',
			'#COLUMNINFO= 3, %, friction ratio, 4',
			'#EOH=',
			'  10   2000   1.5',
			'\t20\t2500\t2.0'
		].join('\n');
		const [s] = parseGef(text, { file: 'site/CPT-3.gef' });
		expect(s.id).toBe('CPT-3');
		expectAllAbsClose(s.depth, [0.1, 0.2], 1e-12, 'depth');
		expectAllAbsClose(s.qc, [2000, 2500], 1e-12, 'qc');
		// fs = Rf·qc/100: 1.5 % of 2000 = 30 kPa, 2 % of 2500 = 50 kPa.
		expectAllAbsClose(s.fs, [30, 50], 1e-9, 'fs');
		expect(s.u2).toBeUndefined();
		expect(s.areaRatio).toBeUndefined();
	});

	it('parseGef(text) accepts several records on a line and no #COLUMN keyword', () => {
		const text = [
			'#GEFID= 1, 1, 0',
			'#COLUMNINFO= 1, m, penetration length, 1',
			'#COLUMNINFO= 2, MPa, cone resistance, 2',
			'#COLUMNINFO= 3, MPa, local friction, 3',
			'#RECORDSEPARATOR= !',
			'#EOH=',
			'0.1 1.0 0.010 ! 0.2 1.1 0.011 !'
		].join('\n');
		const [s] = parseGef(text);
		expectAllAbsClose(s.depth, [0.1, 0.2], 1e-12, 'depth');
		expectAllAbsClose(s.fs, [10, 11], 1e-9, 'fs');
	});

	it('parseGef(text) names line and column for a non-numeric cell', () => {
		const bad = [...HEADER, DATA[0], '0.040;abc;5.0;0.0020;0.039;!'].join('\n');
		const err = expectParseError(() => parseGef(bad, { file: 'x.gef' }), 'not-a-number', HEADER.length + 2, 'cone resistance');
		expect(err.message).toBe(`x.gef: line ${HEADER.length + 2}, column cone resistance: 'abc' is not a number`);
	});

	it('parseGef(text) rejects an unknown unit on its #COLUMNINFO line', () => {
		const bad = GEF.replace('2, MPa, cone resistance', '2, furlongs, cone resistance');
		expectParseError(() => parseGef(bad), 'unknown-unit', 6, 'cone resistance');
		const rf = GEF.replace('3, kPa, local friction, 3', '3, -, friction ratio, 4');
		expectParseError(() => parseGef(rf), 'unknown-unit', 7, 'friction ratio');
	});

	it('parseGef(text) rejects depths that do not increase', () => {
		const bad = [...HEADER, DATA[0], '0.040;0.530;5.0;0.0020;0.020;!'].join('\n');
		expectParseError(() => parseGef(bad), 'depth-not-increasing', HEADER.length + 2, 'corrected depth');
	});

	it('parseGef(text) rejects a void or negative depth', () => {
		const text = ['#GEFID= 1, 1, 0', '#COLUMNINFO= 1, m, penetration length, 1', '#COLUMNINFO= 2, MPa, cone resistance, 2',
			'#COLUMNINFO= 3, MPa, local friction, 3', '#COLUMNVOID= 1, -1', '#EOH=', '-1 1 0.01'].join('\n');
		expectParseError(() => parseGef(text), 'missing-value', 7, 'penetration length');
		expectParseError(() => parseGef(text.replace('-1 1 0.01', '-0.5 1 0.01')), 'malformed', 7, 'penetration length');
	});

	it('parseGef(text) reports missing required columns at #EOH', () => {
		const noQc = GEF.replace('#COLUMNINFO= 2, MPa, cone resistance, 2', '#COLUMNINFO= 2, MPa, something else, 99');
		expectParseError(() => parseGef(noQc), 'missing-column', HEADER.length, 'qc');
		const noFs = GEF.replace('3, kPa, local friction, 3', '3, kPa, other, 98');
		expectParseError(() => parseGef(noFs), 'missing-column', HEADER.length, 'fs');
		const noDepth = GEF.replace('1, m, penetration length, 1', '1, m, a, 97').replace('5, m, corrected depth, 11', '5, m, b, 96');
		expectParseError(() => parseGef(noDepth), 'missing-column', HEADER.length, 'depth');
	});

	it('parseGef(text) rejects malformed structure with the line', () => {
		expectParseError(() => parseGef('depth,qc\n1,2'), 'malformed', 1);
		expectParseError(() => parseGef(HEADER.slice(0, -1).join('\n')), 'malformed', HEADER.length - 1);
		expectParseError(() => parseGef(HEADER.join('\n')), 'malformed', HEADER.length);
		expectParseError(() => parseGef([...HEADER, '0.020;0.512;5.1;!'].join('\n')), 'malformed', HEADER.length + 1);
		expectParseError(() => parseGef(GEF.replace('#COLUMN= 5', '#COLUMN= 4')), 'malformed', 9);
		expectParseError(() => parseGef(GEF.replace('3, 0.75, -', '3, 1.75, -')), 'malformed', 17);
		expectParseError(() => parseGef(GEF.replace('#ZID= 31000, -1.25', '#ZID= 31000, high')), 'not-a-number', 16, 'ZID');
	});

	it('parseGef(text) rejects empty, binary and oversized text', () => {
		expectParseError(() => parseGef(''), 'empty-file', 1);
		expectParseError(() => parseGef(' \n\n'), 'empty-file', 1);
		expectParseError(() => parseGef('#GEFID= 1\n\u0000\u0001'), 'binary-file', 2);
		expectParseError(() => parseGef('#'.repeat(MAX_FILE_BYTES + 1)), 'file-too-large', undefined);
		expect(() => parseGef(42 as unknown as string)).toThrow(TypeError);
	});
});

describe('parseGef(text) on crafted files with real-world habits (tests/cpt/fixtures/gef)', () => {
	const fixture = (name: string) => readFileSync(join(import.meta.dirname, 'fixtures', 'gef', name), 'utf8');

	it('parseGef(text) reads penetration length written as negative numbers growing downward, with a note', () => {
		const [s] = parseGef(fixture('negative-penetration.gef'), { file: 'negative-penetration.gef' });
		expect(s.id).toBe('PS-114');
		expect(s.depth).toHaveLength(40);
		expectAllAbsClose(s.depth.subarray(0, 3), [0.005, 0.025, 0.045], 1e-12, 'depth');
		expect(s.depth[39]).toBeCloseTo(0.785, 12);
		expect(s.notes).toEqual(['Penetration length is recorded as negative numbers growing downward; read as depth below ground']);
		expect(s.groundElevation).toBe(1.1);
	});

	it('parseGef(text) fills void corrected depth from penetration length and says where', () => {
		const [s] = parseGef(fixture('void-corrected-depth.gef'), { file: 'void-corrected-depth.gef' });
		expect(s.id).toBe('DP-07');
		// The first six rows take penetration length (0.02 … 0.12 m), the rest corrected depth (0.140, 0.159 …).
		expectAllAbsClose(s.depth.subarray(0, 8), [0.02, 0.04, 0.06, 0.08, 0.1, 0.12, 0.14, 0.159], 1e-12, 'depth');
		expect(s.notes).toEqual(['corrected depth (quantity 11) is void in the first 6 readings (to 0.12 m); penetration length is used there']);
		// "Mpa" is MPa: 0.437 MPa = 437 kPa.
		expectAbsClose(s.qc[0], 437, 1e-9, 'qc');
	});

	it('parseGef(text) reads units whatever their case (M, Mpa, kpa)', () => {
		const [s] = parseGef(fixture('unit-spellings.gef'));
		expectAbsClose(s.depth[0], 0.1, 1e-12, 'depth');
		expectAbsClose(s.qc[0], 1000 * (0.4 + 0.09 + 0.3 * Math.sin(0.31)), 0.5, 'qc (file rounded to 1 kPa)');
		expectAbsClose(s.fs[0], 8.4, 1e-9, 'fs in kPa as written');
		expect(s.notes).toBeUndefined();
	});

	it('parseGef(text) refuses a borehole log as not a CPT, at its report code', () => {
		const err = expectParseError(() => parseGef(fixture('borehole-log.gef'), { file: 'borehole-log.gef' }), 'not-a-cpt', 5);
		expect(err.message).toBe('borehole-log.gef: line 5: this is a borehole log, not a CPT (REPORTCODE GEF-BORE-Report); only GEF-CPT files hold soundings');
		const viaProcedure = fixture('borehole-log.gef').replace('#REPORTCODE=', '#PROCEDURECODE=');
		expect(expectParseError(() => parseGef(viaProcedure), 'not-a-cpt', 5).detail).toContain('this is a borehole log, not a CPT');
	});

	it('parseGef(text) still refuses depths that change sign part-way, and a single negative reading', () => {
		const err = expectParseError(() => parseGef(fixture('mixed-sign-depth.gef'), { file: 'm.gef' }), 'malformed', 9, 'penetration length');
		expect(err.detail).toBe('depth -0.1 m is negative');
	});

	it('parseGef(text) refuses void corrected depth where penetration length is void too, or absent', () => {
		const text = fixture('void-corrected-depth.gef');
		const bothVoid = text.replace('0.04 0.473', '-9999 0.473').replace('#COLUMNVOID= 2, -9999', '#COLUMNVOID= 1, -9999\n#COLUMNVOID= 2, -9999');
		expect(expectParseError(() => parseGef(bothVoid), 'missing-value', 21, 'corrected depth').detail).toBe(
			'depth is void in both corrected depth and penetration length'
		);
		const noPenetration = text.replace('#COLUMNINFO= 1, m, penetration length, 1', '#COLUMNINFO= 1, m, length of rods, 99');
		expectParseError(() => parseGef(noPenetration), 'missing-value', 19, 'corrected depth');
	});

	it('parseGef(text) reports a depth that does not increase after the negative sign convention in the file\'s terms', () => {
		const text = fixture('negative-penetration.gef').replace('-0.045;', '-0.015;');
		const err = expectParseError(() => parseGef(text), 'depth-not-increasing', 25, 'Penetration length');
		expect(err.detail).toBe('depth 0.015 m does not increase from 0.025 m (read from negative numbers in the file)');
	});
});
