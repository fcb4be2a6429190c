import { describe, expect, it } from 'vitest';
import { detectFormat } from '$lib/cpt';

describe('detectFormat(text, file)', () => {
	it('detectFormat(text, file) recognises GEF and AGS4 by content, then by extension', () => {
		expect(detectFormat('\uFEFF#GEFID= 1, 1, 0\n')).toBe('gef');
		expect(detectFormat('"GROUP","PROJ"\r\n')).toBe('ags4');
		expect(detectFormat('GROUP,SCPT\n')).toBe('ags4');
		expect(detectFormat('depth,qc\n', 'a.csv')).toBe('delimited');
		expect(detectFormat('junk', 'A.GEF')).toBe('gef');
		expect(detectFormat('junk', 'x.ags')).toBe('ags4');
		expect(detectFormat('')).toBe('delimited');
	});
});
