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

	it('previewDelimited(text) guesses a PointID id and a "Z (m NAP)" ground elevation in a semicolon file with decimal commas', () => {
		const text = [
			'PointID;Z (m NAP);X;Y;Penetration length (m);qc (MPa);fs (MPa);u2 (MPa)',
			'DKM-01;-1,25;155000,0;463000,0;0,02;0,512;0,0051;0,0012',
			'DKM-01;-1,25;155000,0;463000,0;0,04;0,530;0,0060;0,0020',
			'DKM-02;-0,90;155040,0;463010,0;0,02;0,480;0,0050;0,0010',
			'DKM-02;-0,90;155040,0;463010,0;0,04;0,610;0,0071;0,0015'
		].join('\r\n');
		const p = previewDelimited(text);
		expect(p.delimiter).toBe(';');
		expect(p.guess).toMatchObject({
			id: 'PointID',
			depth: 'Penetration length (m)',
			qc: 'qc (MPa)',
			fs: 'fs (MPa)',
			u2: 'u2 (MPa)',
			x: { column: 'X' },
			y: { column: 'Y' },
			groundElevation: { column: 'Z (m NAP)' }
		});
		expect(p.guess.units).toMatchObject({ depth: 'm', qc: 'MPa', fs: 'MPa', u2: 'MPa' });
	});

	const guessOf = (header: string, rows: string[]) => previewDelimited([header, ...rows].join('\n')).guess;
	const body = (cells: (i: number) => string) => Array.from({ length: 6 }, (_, i) => cells(i));

	it('previewDelimited(text) recognises common sounding-id headers whatever their case and punctuation', () => {
		for (const h of ['PointID', 'Point ID', 'point_id', 'POINT-ID', 'Test ID', 'TestID', 'CPT', 'cpt no.', 'CPT Number', 'Location', 'LOCA_ID', 'Sounding', 'sounding name', 'Name', 'Borehole', 'Hole ID']) {
			const g = guessOf(`${h},depth,qc,fs`, body((i) => `${i < 3 ? 'A' : 'B'},${(i % 3) + 1},1,10`));
			expect(g.id, h).toBe(h);
		}
	});

	it('previewDelimited(text) prefers a specific id header to a generic one and skips a column that numbers the rows', () => {
		const g = guessOf('Name,Point ID,depth,qc,fs', body((i) => `Site,${i < 3 ? 'P1' : 'P2'},${(i % 3) + 1},1,10`));
		expect(g.id).toBe('Point ID');
		const rowNumbers = guessOf('ID,depth,qc,fs', body((i) => `${i + 1},${i + 1},1,10`));
		expect(rowNumbers.id).toBeUndefined();
	});

	it('previewDelimited(text) recognises common ground-elevation headers and the length unit before a datum', () => {
		const cases: [string, string | undefined][] = [
			['Z (m NAP)', 'm'],
			['Z [mNAP]', 'm'],
			['z', undefined],
			['Elevation', undefined],
			['Ground level (mAOD)', 'm'],
			['GL', undefined],
			['Ground Elevation (ft MSL)', 'ft'],
			['mNAP', undefined],
			['Z_NAP', undefined],
			['RL', undefined]
		];
		for (const [h, unit] of cases) {
			const g = guessOf(`cpt,depth,qc,fs,${h}`, body((i) => `${i < 3 ? 'A' : 'B'},${(i % 3) + 1},1,10,${i < 3 ? '1.5' : '2.0'}`));
			expect(g.groundElevation, h).toEqual({ column: h });
			expect(g.units.coordinates, h).toBe(unit);
		}
	});

	it('previewDelimited(text) does not take an elevation that changes down a sounding as its ground elevation', () => {
		const g = guessOf('cpt,depth,qc,fs,Elevation', body((i) => `${i < 3 ? 'A' : 'B'},${(i % 3) + 1},1,10,${2 - (i % 3)}`));
		expect(g.groundElevation).toBeUndefined();
	});

	it('previewDelimited(text) rejects text without a delimiter and empty text', () => {
		expectParseError(() => previewDelimited('just one column\n1\n'), 'malformed', 1);
		expectParseError(() => previewDelimited('\n\n'), 'empty-file', 1);
	});
});
