import { describe, expect, it } from 'vitest';
import { formatAgs4, parseAgs4 } from '$lib/cpt';
import type { ParsedSounding } from '$lib/cpt';
import { expectAbsClose, expectAllAbsClose, expectAllAbsCloseOrNaN } from '../asserts';

describe('formatAgs4(soundings, options)', () => {
	const soundings: ParsedSounding[] = [
		{
			id: 'CPT "A"',
			x: 100.25,
			y: 200.5,
			groundElevation: 1.75,
			areaRatio: 0.8,
			depth: Float64Array.from([0.02, 0.04, 0.06]),
			qc: Float64Array.from([512.3, NaN, 1800.7]),
			fs: Float64Array.from([5.12, 6.3, 7]),
			u2: Float64Array.from([12.5, 15, -3.25])
		},
		{ id: 'B', depth: Float64Array.from([1, 2]), qc: Float64Array.from([3000, 3500]), fs: Float64Array.from([30, 35]) }
	];

	it('formatAgs4(soundings) round-trips through parseAgs4 within its written decimals', () => {
		const text = formatAgs4(soundings);
		expect(text).toContain('"GROUP","SCPT"');
		expect(text.includes('\r\n')).toBe(true);
		const [a, b] = parseAgs4(text);
		expect(a.id).toBe('CPT "A"');
		expectAllAbsClose(a.depth, soundings[0].depth, 5e-4, 'depth');
		// Defaults: qc 3 decimals of MN/m2 (0.5 kPa), fs 1 decimal of kN/m2, u2 4 decimals of MN/m2.
		expectAllAbsCloseOrNaN(a.qc, soundings[0].qc, 0.5, 'qc');
		expectAllAbsClose(a.fs, soundings[0].fs, 0.05, 'fs');
		expectAllAbsClose(a.u2!, soundings[0].u2!, 0.05, 'u2');
		expectAbsClose(a.x!, 100.25, 5e-3);
		expectAbsClose(a.groundElevation!, 1.75, 5e-3);
		expect(a.areaRatio).toBe(0.8);
		expect(a.meta?.PROJ_ID).toBe('CONEFIELD');
		expect(b.id).toBe('B');
		expect(b.x).toBeUndefined();
		// A sounding without u2 in a file where others have it reads back as void u2.
		expect(Array.from(b.u2!).every(Number.isNaN)).toBe(true);
		expectAllAbsClose(b.qc, [3000, 3500], 1e-9, 'qc');
	});

	it('formatAgs4(soundings, options) keeps more decimals on request', () => {
		const [a] = parseAgs4(formatAgs4(soundings, { projectId: 'X', decimals: { depth: 9, qc: 12, fs: 9, u2: 12, coordinates: 6 } }));
		expectAllAbsCloseOrNaN(a.qc, soundings[0].qc, 1e-8, 'qc');
		expectAllAbsClose(a.fs, soundings[0].fs, 1e-8, 'fs');
		expect(a.meta?.PROJ_ID).toBe('X');
	});

	it('formatAgs4(soundings) throws RangeError for duplicate ids and unequal columns', () => {
		expect(() => formatAgs4([soundings[1], soundings[1]])).toThrow('sounding ids must be unique');
		expect(() => formatAgs4([{ ...soundings[1], fs: Float64Array.from([1]) }])).toThrow('columns must have equal lengths');
	});
});
