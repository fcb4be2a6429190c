import { describe, expect, it } from 'vitest';
import { previewDelimited } from '$lib/cpt';
import { expectParseError } from './expectParseError';

const CSV = [
	'sounding,depth,qc,fs,u2,easting,northing,gl',
	'A,0.5,1.20,10,5,100,200,3.0',
	'A,1.0,1.50,,8,100,200,3.0',
	'B,0.5,2.00,20,NaN,150,210,2.5',
	'A,1.5,1.80,15,12,100,200,3.0',
	'B,1.0,2.50,25,-,150,210,2.5'
].join('\n');

describe('previewDelimited(text, options)', () => {
	it('previewDelimited(text) returns headers, the first rows and a guessed mapping', () => {
		const p = previewDelimited(CSV, { rows: 2 });
		expect(p.delimiter).toBe(',');
		expect(p.headers).toEqual(['sounding', 'depth', 'qc', 'fs', 'u2', 'easting', 'northing', 'gl']);
		expect(p.rows).toEqual([
			['A', '0.5', '1.20', '10', '5', '100', '200', '3.0'],
			['A', '1.0', '1.50', '', '8', '100', '200', '3.0']
		]);
		expect(p.rowCount).toBe(5);
		expect(p.guess).toEqual({
			delimiter: ',',
			id: 'sounding',
			depth: 'depth',
			qc: 'qc',
			fs: 'fs',
			u2: 'u2',
			units: { depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' },
			x: { column: 'easting' },
			y: { column: 'northing' },
			groundElevation: { column: 'gl' }
		});
	});

	it('previewDelimited(text) takes units from the header and from magnitudes', () => {
		const a = previewDelimited('Test ID;Depth [ft];Cone resistance (tsf);Sleeve friction (tsf);U2 (MPa);Chainage (ft)\nX;1;50;0.5;0.01;10\n');
		expect(a.delimiter).toBe(';');
		expect(a.guess.units).toEqual({ depth: 'ft', qc: 'tsf', fs: 'tsf', u2: 'MPa', coordinates: 'ft' });
		expect(a.guess.id).toBe('Test ID');
		expect(a.guess.chainage).toEqual({ column: 'Chainage (ft)' });
		// Rules of our own: qc above 300 reads as kPa, fs below 2 as MPa.
		const b = previewDelimited('depth\tqc\tfs\n1\t2500\t0.02\n2\t3000\t0.03\n');
		expect(b.delimiter).toBe('\t');
		expect(b.guess.units.qc).toBe('kPa');
		expect(b.guess.units.fs).toBe('MPa');
		// Friction ratio is not sleeve friction.
		const c = previewDelimited('depth,qc,friction ratio\n1,2,3\n');
		expect(c.guess.fs).toBeUndefined();
	});

	it('previewDelimited(text) rejects text without a delimiter and empty text', () => {
		expectParseError(() => previewDelimited('just one column\n1\n'), 'malformed', 1);
		expectParseError(() => previewDelimited('\n\n'), 'empty-file', 1);
	});
});
