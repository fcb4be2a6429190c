import { describe, expect, it } from 'vitest';
import { CptParseError, MAX_FILE_BYTES, decodeCptText } from '$lib/cpt';

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
