import { describe, expect, it } from 'vitest';
import { formatGef, parseGef } from '$lib/cpt';
import type { ParsedSounding } from '$lib/cpt';
import { expectAbsClose, expectAllAbsClose, expectAllAbsCloseOrNaN } from '../asserts';

describe('formatGef(sounding, options)', () => {
	const sounding: ParsedSounding = {
		id: 'S-1',
		x: 1234.5,
		y: 6789.25,
		groundElevation: 2.4,
		areaRatio: 0.8,
		depth: Float64Array.from([0.02, 0.04, 0.06, 0.08]),
		qc: Float64Array.from([512.3, 530, NaN, 1800.7]),
		fs: Float64Array.from([5.12, 6.3, 7, NaN]),
		u2: Float64Array.from([12.5, NaN, 20, -3.25])
	};

	it('formatGef(sounding) round-trips through parseGef within its written decimals', () => {
		const [s] = parseGef(formatGef(sounding));
		expect(s.id).toBe('S-1');
		expectAllAbsClose(s.depth, sounding.depth, 5e-4, 'depth');
		// Defaults: qc 4 decimals of MPa (0.05 kPa), fs and u2 5 decimals of MPa (0.005 kPa).
		expectAllAbsCloseOrNaN(s.qc, sounding.qc, 0.05, 'qc');
		expectAllAbsCloseOrNaN(s.fs, sounding.fs, 0.005, 'fs');
		expectAllAbsCloseOrNaN(s.u2!, sounding.u2!, 0.005, 'u2');
		expectAbsClose(s.x!, 1234.5, 5e-4);
		expectAbsClose(s.y!, 6789.25, 5e-4);
		expectAbsClose(s.groundElevation!, 2.4, 5e-4);
		expect(s.areaRatio).toBe(0.8);
	});

	it('formatGef(sounding, options) round-trips with separators and many decimals', () => {
		const text = formatGef(sounding, { columnSeparator: ';', recordSeparator: '!', decimals: { depth: 9, qc: 12, fs: 12, u2: 12 } });
		expect(text).toContain('#COLUMNSEPARATOR= ;');
		const [s] = parseGef(text);
		expectAllAbsClose(s.depth, sounding.depth, 1e-9, 'depth');
		expectAllAbsCloseOrNaN(s.qc, sounding.qc, 1e-8, 'qc');
		expectAllAbsCloseOrNaN(s.fs, sounding.fs, 1e-8, 'fs');
	});

	it('formatGef(sounding) writes no u2 column when there is none', () => {
		const { u2: _u2, ...rest } = sounding;
		const text = formatGef(rest);
		expect(text).toContain('#COLUMN= 3');
		expect(parseGef(text)[0].u2).toBeUndefined();
	});

	it('formatGef(sounding, options) throws for bad options and unequal columns', () => {
		expect(() => formatGef({ ...sounding, qc: Float64Array.from([1]) })).toThrow(RangeError);
		expect(() => formatGef(sounding, { decimals: { qc: 1.5 } })).toThrow('qc decimals must be an integer within 0–20');
		expect(() => formatGef(sounding, { columnSeparator: '.' })).toThrow(TypeError);
	});
});
