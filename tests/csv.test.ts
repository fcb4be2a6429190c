import { describe, expect, it } from 'vitest';
import { csvField, csvLine, numberText, roundedCell, significantCell } from '../src/lib/csv';

describe('roundedCell(v, decimals)', () => {
	it('roundedCell rounds to fixed decimals, never writes "-0", and leaves undefined values blank', () => {
		expect(roundedCell(0.6000000000000001, 3)).toBe('0.600');
		expect(roundedCell(1234.5678, 0)).toBe('1235');
		expect(roundedCell(-0.0004, 3)).toBe('0.000');
		expect(roundedCell(-0.4, 0)).toBe('0');
		expect(roundedCell(-1.25, 1)).toBe('-1.3');
		for (const v of [NaN, Infinity, -Infinity, null, undefined]) expect(roundedCell(v, 2)).toBe('');
	});
});

describe('significantCell(v, digits)', () => {
	it('significantCell writes the shortest form to the given significant figures (binary noise gone)', () => {
		expect(significantCell(0.6000000000000001, 4)).toBe('0.6');
		expect(significantCell(3 * 0.1, 6)).toBe('0.3');
		expect(significantCell(0.000123456, 4)).toBe('0.0001235');
		expect(significantCell(123456.7, 4)).toBe('123500');
		expect(significantCell(-0.00001, 1)).toBe('-0.00001');
		expect(significantCell(-0, 3)).toBe('0');
		for (const v of [NaN, Infinity, -Infinity, null, undefined]) expect(significantCell(v, 3)).toBe('');
	});
});

describe('csvField(s) and csvLine(cells)', () => {
	it('csvField quotes a comma, quote or line break and doubles quotes (RFC 4180); csvLine joins with commas', () => {
		expect(csvField('LV-01')).toBe('LV-01');
		expect(csvField('CPT 7, north')).toBe('"CPT 7, north"');
		expect(csvField('the "east" one')).toBe('"the ""east"" one"');
		expect(csvField('two\nlines')).toBe('"two\nlines"');
		expect(csvLine(['a', 'b,c', ''])).toBe('a,"b,c",');
	});
});

describe('numberText(v)', () => {
	it('numberText writes every finite number as String(v) does (ECMA-262 Number::toString, −0 as "0")', () => {
		const odd = [0, -0, 0.1, 1 / 3, 1e21, 1e-7, 123456789012345680000, 5e-324, Number.MAX_VALUE, -1.5e-300, 2 ** 53 + 2, 100, -42];
		for (const v of odd) expect(numberText(v)).toBe(String(v));
		let s = 0x2545f491;
		for (let i = 0; i < 20_000; i++) {
			s = (s * 1103515245 + 12345) >>> 0;
			const v = (s / 2 ** 32 - 0.5) * 10 ** ((s % 40) - 20);
			expect(numberText(v)).toBe(String(v));
		}
	});
});
