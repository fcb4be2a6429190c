import { describe, expect, it } from 'vitest';
import { formatDelimited, parseDelimited, previewDelimited } from '$lib/cpt';
import type { DelimitedMapping, ParsedSounding } from '$lib/cpt';
import { expectAllAbsClose, expectAllAbsCloseOrNaN } from '../asserts';

describe('formatDelimited(soundings, options)', () => {
	const soundings: ParsedSounding[] = [
		{
			id: 'A,1',
			x: 10.5,
			y: 20.25,
			groundElevation: 1.5,
			areaRatio: 0.75,
			depth: Float64Array.from([0.02, 0.04]),
			qc: Float64Array.from([512.3, NaN]),
			fs: Float64Array.from([5.12, 6.3]),
			u2: Float64Array.from([12.5, -3.25])
		},
		{ id: 'B', chainage: 35, depth: Float64Array.from([1, 2]), qc: Float64Array.from([3000, 3500]), fs: Float64Array.from([30, 35]) }
	];

	for (const delimiter of [',', ';', '\t'] as const) {
		it(`formatDelimited(soundings, { delimiter: ${JSON.stringify(delimiter)} }) round-trips through previewDelimited's guess and parseDelimited`, () => {
			const text = formatDelimited(soundings, { delimiter });
			const { guess } = previewDelimited(text);
			const [a, b] = parseDelimited(text, guess as DelimitedMapping);
			expect(a.id).toBe('A,1');
			expectAllAbsClose(a.depth, soundings[0].depth, 5e-4, 'depth');
			// Defaults: qc 4 decimals of MPa (0.05 kPa), fs and u2 2 decimals of kPa.
			expectAllAbsCloseOrNaN(a.qc, soundings[0].qc, 0.05, 'qc');
			expectAllAbsClose(a.fs, soundings[0].fs, 0.005, 'fs');
			expectAllAbsClose(a.u2!, soundings[0].u2!, 0.005, 'u2');
			expect([a.x, a.y, a.groundElevation, a.areaRatio]).toEqual([10.5, 20.25, 1.5, 0.75]);
			expect(a.chainage).toBeUndefined();
			expect(b.chainage).toBe(35);
			expect(b.areaRatio).toBe(0.8);
			expectAllAbsCloseOrNaN(b.u2!, [NaN, NaN], 0, 'u2');
		});
	}

	it('formatDelimited(soundings) throws for duplicate ids, bad delimiters and unequal columns', () => {
		expect(() => formatDelimited([soundings[1], soundings[1]])).toThrow('sounding ids must be unique');
		expect(() => formatDelimited(soundings, { delimiter: '|' as ',' })).toThrow(RangeError);
		expect(() => formatDelimited([{ ...soundings[1], qc: Float64Array.from([1]) }])).toThrow('columns must have equal lengths');
	});
});
