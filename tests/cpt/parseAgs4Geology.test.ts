import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseAgs4, parseAgs4Geology } from '$lib/cpt';
import { expectParseError } from './expectParseError';

const GEOL_AGS = readFileSync(join(import.meta.dirname, 'fixtures', 'ags4', 'geol.ags'), 'utf8');
const SMALL = [
	'"GROUP","GEOL"',
	'"HEADING","LOCA_ID","GEOL_TOP","GEOL_BASE","GEOL_DESC","GEOL_GEOL"',
	'"UNIT","","ft","ft","",""',
	'"TYPE","ID","2DP","2DP","X","PA"',
	'"DATA","A","0","10","Stiff brown CLAY","CL"',
	'"DATA","A","10","","Dense SAND",""'
].join('\n');

describe('parseAgs4Geology(text)', () => {
	it('parseAgs4Geology(text) reads every GEOL row of the crafted file in order, beside the CPT groups parseAgs4 reads', () => {
		const layers = parseAgs4Geology(GEOL_AGS);
		expect(layers).toHaveLength(13);
		expect(layers[0]).toMatchObject({ locaId: 'CF-01', top: 0, base: 1.2, code: 'MG', description: 'Made ground: soft brown sandy clay with brick fragments' });
		expect(layers.filter((l) => l.locaId === 'CF-03').map((l) => [l.top, l.code])).toEqual([
			[0, 'MG'],
			[1, 'ALV'],
			[3, 'SND'],
			[3.6, 'ALV'],
			[4.8, 'SND']
		]);
		expect(layers.every((l, k) => k === 0 || l.line > layers[k - 1].line)).toBe(true);
		// The same file still reads as three soundings; BH-04 has a log but no CPT.
		expect(parseAgs4(GEOL_AGS).map((s) => s.id)).toEqual(['CF-01', 'CF-02', 'CF-03']);
	});

	it('parseAgs4Geology(text) converts feet (1 ft = 0.3048 m exactly) and keeps blank codes and bases', () => {
		const layers = parseAgs4Geology(SMALL);
		expect(layers[0]).toMatchObject({ top: 0, base: 3.048, code: 'CL', line: 5 });
		expect(layers[1].top).toBeCloseTo(3.048, 12);
		expect(layers[1].base).toBeNaN();
		expect(layers[1].code).toBe('');
	});

	it('parseAgs4Geology(text) gives no layers for a file without a GEOL group', () => {
		expect(parseAgs4Geology('"GROUP","PROJ"\n"HEADING","PROJ_ID"\n"DATA","X"\n')).toEqual([]);
	});

	it('parseAgs4Geology(text) names the line and heading of a row it cannot read', () => {
		expectParseError(() => parseAgs4Geology(SMALL.replace('"A","0","10"', '"A","x","10"')), 'not-a-number', 5, 'GEOL_TOP');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"A","0","10"', '"A","","10"')), 'missing-value', 5, 'GEOL_TOP');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"A","0","10"', '"A","-1","10"')), 'malformed', 5, 'GEOL_TOP');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"A","0","10"', '"A","5","2"')), 'malformed', 5, 'GEOL_BASE');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"A","0","10"', '"","0","10"')), 'missing-value', 5, 'LOCA_ID');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"GEOL_TOP"', '"GEOL_TOPX"')), 'missing-column', 2, 'GEOL_TOP');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"ft","ft"', '"yd","ft"')), 'unknown-unit', 2, 'GEOL_TOP');
		expectParseError(() => parseAgs4Geology(SMALL.replace('"Dense SAND",""', '"Dense SAND"')), 'malformed', 6);
	});
});
