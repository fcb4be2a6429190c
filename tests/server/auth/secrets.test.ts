import { describe, expect, it } from 'vitest';
import { generateToken, hashToken } from '$lib/server/auth/secrets';

describe('hashToken / generateToken', () => {
	it('hashToken("abc") is the FIPS 180-2 SHA-256 example digest', () => {
		// FIPS 180-2, Appendix B.1.
		expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
	});

	it('hashToken(t) is 64 lower-case hex characters and differs for a one-character change', () => {
		const a = hashToken('cf_aaaa');
		expect(a).toMatch(/^[0-9a-f]{64}$/);
		expect(hashToken('cf_aaab')).not.toBe(a);
	});

	it('hashToken rejects an empty token with TypeError', () => {
		expect(() => hashToken('')).toThrow(TypeError);
	});

	it('generateToken(prefix) is the prefix and 32 random bytes in base64url (43 characters), never repeating', () => {
		const tokens = Array.from({ length: 200 }, () => generateToken('cf'));
		for (const t of tokens) expect(t).toMatch(/^cf_[A-Za-z0-9_-]{43}$/);
		expect(new Set(tokens).size).toBe(200);
		expect(generateToken('invite')).toMatch(/^invite_/);
	});
});
