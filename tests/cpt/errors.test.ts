import { describe, expect, it } from 'vitest';
import {
	CptFlag,
	CptParseError,
	MAX_FILE_BYTES,
	TSF_TO_KPA,
	assertFileSize,
	decodeCptText,
	describeFlags,
	detectFormat,
	lengthUnitFactor,
	stressUnitFactor
} from '$lib/cpt';

describe('CptParseError', () => {
	it('new CptParseError(init) formats file, line and column into its message and keeps them as fields', () => {
		const e = new CptParseError({ code: 'not-a-number', file: 'a.csv', line: 17, column: 'qc', detail: "'abc' is not a number" });
		expect(e).toBeInstanceOf(Error);
		expect(e.name).toBe('CptParseError');
		expect(e.message).toBe("a.csv: line 17, column qc: 'abc' is not a number");
		expect([e.code, e.file, e.line, e.column, e.detail]).toEqual(['not-a-number', 'a.csv', 17, 'qc', "'abc' is not a number"]);
		expect(new CptParseError({ code: 'malformed', line: 3, detail: 'x' }).message).toBe('line 3: x');
		expect(new CptParseError({ code: 'file-too-large', detail: 'too big' }).message).toBe('too big');
	});
});

describe('assertFileSize(byteLength, file)', () => {
	it('assertFileSize(byteLength) accepts 50 MB and rejects one byte more', () => {
		expect(MAX_FILE_BYTES).toBe(50 * 1024 * 1024);
		expect(() => assertFileSize(MAX_FILE_BYTES)).not.toThrow();
		try {
			assertFileSize(MAX_FILE_BYTES + 1, 'big.gef');
			expect.fail('expected a throw');
		} catch (e) {
			expect(e).toBeInstanceOf(CptParseError);
			expect((e as CptParseError).code).toBe('file-too-large');
			expect((e as CptParseError).file).toBe('big.gef');
			expect((e as CptParseError).line).toBeUndefined();
			expect((e as Error).message).toBe('big.gef: file is 50.0 MB, over the 50 MB limit');
		}
	});
});

describe('decodeCptText(bytes, file)', () => {
	it('decodeCptText(bytes) decodes UTF-8, falls back to Windows-1252 and reads UTF-16 with a byte-order mark', () => {
		expect(decodeCptText(new TextEncoder().encode('σ\'v,qc\n'))).toBe("σ'v,qc\n");
		// 0xE9 alone is invalid UTF-8; in Windows-1252 it is é.
		expect(decodeCptText(Uint8Array.from([0x63, 0x61, 0x66, 0xe9]))).toBe('café');
		expect(decodeCptText(Uint8Array.from([0xff, 0xfe, 0x61, 0x00, 0x62, 0x00]))).toBe('ab');
		expect(decodeCptText(Uint8Array.from([0xfe, 0xff, 0x00, 0x61]))).toBe('a');
	});
	it('decodeCptText(bytes) rejects a NUL byte as binary with its line, and oversized input', () => {
		try {
			decodeCptText(Uint8Array.from([0x61, 0x0a, 0x62, 0x0a, 0x00]), 'x.bin');
			expect.fail('expected a throw');
		} catch (e) {
			expect((e as CptParseError).code).toBe('binary-file');
			expect((e as CptParseError).line).toBe(3);
		}
		// The size check comes before any decoding (this buffer is all NUL bytes, yet the size is reported).
		expect(() => decodeCptText(new Uint8Array(MAX_FILE_BYTES + 1))).toThrow('over the 50 MB limit');
		expect(() => decodeCptText('text' as unknown as Uint8Array)).toThrow(TypeError);
	});
});

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

describe('stressUnitFactor(unit) and lengthUnitFactor(unit)', () => {
	it('stressUnitFactor(unit) knows exact factors to kPa, case- and spelling-insensitive', () => {
		expect(stressUnitFactor('MPa')).toBe(1000);
		expect(stressUnitFactor('MN/m2')).toBe(1000);
		expect(stressUnitFactor('MN/m²')).toBe(1000);
		expect(stressUnitFactor('kN/m^2')).toBe(1);
		expect(stressUnitFactor(' kpa ')).toBe(1);
		expect(stressUnitFactor('Pa')).toBe(0.001);
		expect(stressUnitFactor('bar')).toBe(100);
		expect(stressUnitFactor('tsf')).toBe(TSF_TO_KPA);
		expect(stressUnitFactor('psi')).toBeUndefined();
		expect(stressUnitFactor('')).toBeUndefined();
	});
	it('lengthUnitFactor(unit) knows m, cm, mm and ft', () => {
		expect(lengthUnitFactor('m')).toBe(1);
		expect(lengthUnitFactor('cm')).toBe(0.01);
		expect(lengthUnitFactor('MM')).toBe(0.001);
		expect(lengthUnitFactor('ft')).toBe(0.3048);
		expect(lengthUnitFactor('yd')).toBeUndefined();
	});
});

describe('describeFlags(mask)', () => {
	it('describeFlags(mask) names the bits set, in bit order', () => {
		expect(describeFlags(0)).toEqual([]);
		expect(describeFlags(CptFlag.drOutOfRange | CptFlag.missingReading)).toEqual(['missingReading', 'drOutOfRange']);
		const all = Object.values(CptFlag).reduce((a, b) => a | b, 0);
		expect(describeFlags(all)).toEqual(Object.keys(CptFlag));
		// Every flag is a distinct single bit.
		const bits = Object.values(CptFlag);
		expect(new Set(bits).size).toBe(bits.length);
		for (const b of bits) expect(b & (b - 1)).toBe(0);
	});
});
