import { describe, it, expect } from 'vitest';
import { sha256 } from '../../../src/lib/geostat/index';

// Test vectors of NIST FIPS 180-4 / the NIST example values for SHA-256 ("abc", the 448-bit two-block
// message, the empty string) and the one-million-'a' message (NIST, from memory, widely republished).
describe('sha256(input)', () => {
	it('sha256("abc") is the FIPS 180-4 example digest', () => {
		expect(sha256('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
	});
	it('sha256 of the 448-bit message "abcdbcde…nopq" is the FIPS 180-4 two-block example digest', () => {
		expect(sha256('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
			'248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'
		);
	});
	it('sha256("") is the NIST empty-message digest', () => {
		expect(sha256('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
		expect(sha256(new Uint8Array(0))).toBe(sha256(''));
	});
	it('sha256 of one million "a" is the NIST long-message digest (from memory)', () => {
		expect(sha256('a'.repeat(1_000_000))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
	});
	it('sha256 encodes strings as UTF-8 and pads at the 55/56/64-byte block edges consistently', () => {
		expect(sha256('é')).toBe(sha256(new Uint8Array([0xc3, 0xa9])));
		const seen = new Set<string>();
		for (const n of [55, 56, 63, 64, 65]) seen.add(sha256('x'.repeat(n)));
		expect(seen.size).toBe(5);
		expect(() => sha256(42 as unknown as string)).toThrow(TypeError);
	});
});
