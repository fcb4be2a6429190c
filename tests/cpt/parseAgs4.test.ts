import { describe, expect, it } from 'vitest';
import { parseAgs4 } from '$lib/cpt';
import { expectAllAbsClose, expectAllAbsCloseOrNaN } from '../asserts';
import { expectParseError } from './expectParseError';

// A hand-written AGS4 file (groups and headings from memory of the AGS4 dictionary, see REFERENCES.md).
const LINES = [
	'"GROUP","PROJ"', //                                                             1
	'"HEADING","PROJ_ID","PROJ_NAME"',
	'"UNIT","",""',
	'"TYPE","ID","X"',
	'"DATA","P-12","Levee, ""north"" reach"', //                                     5
	'',
	'"GROUP","LOCA"',
	'"HEADING","LOCA_ID","LOCA_TYPE","LOCA_NATE","LOCA_NATN","LOCA_GL"',
	'"UNIT","","","m","m","m"',
	'"TYPE","ID","PA","2DP","2DP","2DP"', //                                           10
	'"DATA","CPT1","CPT","1000.00","2000.00","3.50"',
	'"DATA","CPT2","CPT","1050.00","2010.00","3.10"',
	'',
	'"GROUP","SCPG"',
	'"HEADING","LOCA_ID","SCPG_TESN","SCPG_CAR"', //                                  15
	'"UNIT","","",""',
	'"TYPE","ID","X","2DP"',
	'"DATA","CPT1","1","0.75"',
	'"DATA","CPT2","1","0.80"',
	'"DATA","CPT2","2","0.85"', //                                                    20
	'',
	'"GROUP","SCPT"',
	'"HEADING","LOCA_ID","SCPG_TESN","SCPT_DPTH","SCPT_RES","SCPT_FRES","SCPT_PWP2","SCPT_QT"',
	'"UNIT","","","m","MN/m2","kN/m2","MN/m2","MN/m2"',
	'"TYPE","ID","X","2DP","3DP","1DP","3DP","3DP"', //                                25
	'"DATA","CPT1","1","0.10","1.200","12.5","0.010","1.2"',
	'"DATA","CPT1","1","0.20","1.500","","0.020","1.5"',
	'"DATA","CPT2","1","0.10","2.000","20.0","","2.0"',
	'"DATA","CPT2","2","0.50","3.000","30.0","0.050","3.0"',
	'"DATA","CPT2","2","0.60","3.100","31.0","0.060","3.1"' //                        30
];
const AGS = LINES.join('\r\n') + '\r\n';


const withLine = (n: number, text: string) => LINES.map((l, i) => (i === n - 1 ? text : l)).join('\n');

describe('parseAgs4(text)', () => {
	it('parseAgs4(text) reads LOCA, SCPG and SCPT into soundings per location and test, in kPa and m', () => {
		const out = parseAgs4(AGS);
		expect(out.map((s) => s.id)).toEqual(['CPT1', 'CPT2/1', 'CPT2/2']);
		const [a, b, c] = out;
		expectAllAbsClose(a.depth, [0.1, 0.2], 1e-12, 'depth');
		expectAllAbsClose(a.qc, [1200, 1500], 1e-9, 'qc');
		expectAllAbsCloseOrNaN(a.fs, [12.5, NaN], 1e-12, 'fs');
		expectAllAbsClose(a.u2!, [10, 20], 1e-9, 'u2');
		expect(a.x).toBe(1000);
		expect(a.y).toBe(2000);
		expect(a.groundElevation).toBe(3.5);
		expect(a.areaRatio).toBe(0.75);
		expect(a.meta).toEqual({ LOCA_ID: 'CPT1', SCPG_TESN: '1', PROJ_ID: 'P-12' });
		expectAllAbsCloseOrNaN(b.u2!, [NaN], 0, 'u2');
		expect(b.areaRatio).toBe(0.8);
		expect(c.areaRatio).toBe(0.85);
		expect(c.x).toBe(1050);
		expectAllAbsClose(c.depth, [0.5, 0.6], 1e-12, 'depth');
	});

	it('parseAgs4(text) honours MPa, kPa and ft units and unquoted fields', () => {
		const text = [
			'GROUP,SCPT',
			'HEADING,LOCA_ID,SCPT_DPTH,SCPT_RES,SCPT_FRES',
			'UNIT,,ft,kPa,MPa',
			'TYPE,ID,2DP,0DP,3DP',
			'DATA,A,10,1500,0.015',
			'DATA,A,20,1600,0.016'
		].join('\n');
		const [s] = parseAgs4(text);
		expect(s.id).toBe('A');
		expectAllAbsClose(s.depth, [3.048, 6.096], 1e-12, 'depth');
		expectAllAbsClose(s.qc, [1500, 1600], 1e-12, 'qc');
		expectAllAbsClose(s.fs, [15, 16], 1e-12, 'fs');
		expect(s.u2).toBeUndefined();
		expect(s.areaRatio).toBeUndefined();
	});

	it('parseAgs4(text) names line and heading for a non-numeric cell', () => {
		const err = expectParseError(() => parseAgs4(withLine(27, '"DATA","CPT1","1","0.20","abc","","0.020","1.5"'), { file: 'a.ags' }), 'not-a-number', 27, 'SCPT_RES');
		expect(err.message).toBe("a.ags: line 27, column SCPT_RES: 'abc' is not a number");
	});

	it('parseAgs4(text) rejects an unknown or missing unit on the SCPT heading', () => {
		expectParseError(() => parseAgs4(withLine(24, '"UNIT","","","m","psi","kN/m2","MN/m2","MN/m2"')), 'unknown-unit', 23, 'SCPT_RES');
		expectParseError(() => parseAgs4(withLine(24, '"UNIT","","","m","","kN/m2","MN/m2","MN/m2"')), 'unknown-unit', 23, 'SCPT_RES');
		expectParseError(() => parseAgs4(withLine(24, '"UNIT","","","yd","MN/m2","kN/m2","MN/m2","MN/m2"')), 'unknown-unit', 23, 'SCPT_DPTH');
	});

	it('parseAgs4(text) rejects depths that do not increase within a test', () => {
		expectParseError(() => parseAgs4(withLine(27, '"DATA","CPT1","1","0.10","1.500","","0.020","1.5"')), 'depth-not-increasing', 27, 'SCPT_DPTH');
		expectParseError(() => parseAgs4(withLine(27, '"DATA","CPT1","1","","1.500","","0.020","1.5"')), 'missing-value', 27, 'SCPT_DPTH');
		expectParseError(() => parseAgs4(withLine(26, '"DATA","CPT1","1","-0.10","1.200","12.5","0.010","1.2"')), 'malformed', 26, 'SCPT_DPTH');
	});

	it('parseAgs4(text) reports a missing required heading on its HEADING line', () => {
		const bad = AGS.replace('"SCPT_FRES"', '"SCPT_XXXX"');
		expectParseError(() => parseAgs4(bad), 'missing-column', 23, 'SCPT_FRES');
	});

	it('parseAgs4(text) rejects malformed structure with the line', () => {
		expectParseError(() => parseAgs4('"HEADING","LOCA_ID"\n'), 'malformed', 1);
		expectParseError(() => parseAgs4(withLine(28, '"DATA","CPT2","1","0.10","2.000"')), 'malformed', 28);
		expectParseError(() => parseAgs4(withLine(28, '"DATA","CPT2","1","0.10","2.000,"20.0","","2.0"')), 'malformed', 28);
		expectParseError(() => parseAgs4(withLine(28, '"NOTE","CPT2"')), 'malformed', 28);
		expectParseError(() => parseAgs4(withLine(18, '"DATA","CPT1","1","1.75"')), 'malformed', 18, 'SCPG_CAR');
		expectParseError(() => parseAgs4(LINES.slice(0, 20).join('\n')), 'malformed', undefined);
		expectParseError(() => parseAgs4(LINES.slice(0, 25).join('\n')), 'malformed', undefined);
	});

	it('parseAgs4(text) rejects empty and binary text', () => {
		expectParseError(() => parseAgs4(''), 'empty-file', 1);
		expectParseError(() => parseAgs4('"GROUP","SCPT"\n\u0000'), 'binary-file', 2);
	});
});
