import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';

describe('hashPassword / verifyPassword (scrypt, RFC 7914)', () => {
	it('hashPassword(p) records scrypt, its parameters, a 16-byte salt and a 64-byte key', async () => {
		const parts = (await hashPassword('correct horse battery')).split('$');
		expect(parts.slice(0, 4)).toEqual(['scrypt', '16384', '8', '1']);
		expect(Buffer.from(parts[4], 'base64')).toHaveLength(16);
		expect(Buffer.from(parts[5], 'base64')).toHaveLength(64);
	});

	it('verifyPassword(p, hashPassword(p)) is true and false for any other password', async () => {
		const stored = await hashPassword('correct horse battery');
		expect(await verifyPassword('correct horse battery', stored)).toBe(true);
		expect(await verifyPassword('correct horse batterY', stored)).toBe(false);
		expect(await verifyPassword('', stored)).toBe(false);
	});

	it('hashPassword(p) uses a fresh salt each time, so equal passwords hash differently', async () => {
		const [a, b] = await Promise.all([hashPassword('same password'), hashPassword('same password')]);
		expect(a).not.toBe(b);
		expect(a.split('$')[4]).not.toBe(b.split('$')[4]);
		expect(await verifyPassword('same password', a)).toBe(true);
		expect(await verifyPassword('same password', b)).toBe(true);
	});

	it('verifyPassword normalises Unicode (NFKC), so composed and decomposed é match', async () => {
		const stored = await hashPassword('caf\u00e9 au lait');
		expect(await verifyPassword('cafe\u0301 au lait', stored)).toBe(true);
	});

	it('verifyPassword(p, h) is false for a missing or malformed hash', async () => {
		expect(await verifyPassword('x', null)).toBe(false);
		expect(await verifyPassword('x', undefined)).toBe(false);
		expect(await verifyPassword('x', 'plain-text')).toBe(false);
		expect(await verifyPassword('x', 'bcrypt$1$2$3$4$5')).toBe(false);
		expect(await verifyPassword('x', 'scrypt$a$8$1$c2FsdA==$aGFzaA==')).toBe(false);
		expect(await verifyPassword('x', 'scrypt$16384$8$1$c2FsdA==$')).toBe(false);
	});

	it('verifyPassword accepts a hash with other parameters (they travel with the hash)', async () => {
		const { scryptSync } = await import('node:crypto');
		const salt = Buffer.from('0123456789abcdef');
		const key = scryptSync('pw-with-n-1024', salt, 32, { N: 1024, r: 8, p: 1 });
		const stored = ['scrypt', 1024, 8, 1, salt.toString('base64'), key.toString('base64')].join('$');
		expect(await verifyPassword('pw-with-n-1024', stored)).toBe(true);
		expect(await verifyPassword('pw-with-n-1025', stored)).toBe(false);
	});

	it('scrypt matches the RFC 7914 §12 test vector ("password", "NaCl", N=1024, r=8, p=16)', async () => {
		const { scryptSync } = await import('node:crypto');
		const key = scryptSync('password', 'NaCl', 64, { N: 1024, r: 8, p: 16 });
		// RFC 7914, section 12, second vector, first 16 bytes (from memory; Node must agree).
		expect(key.subarray(0, 16).toString('hex')).toBe('fdbabe1c9d3472007856e7190d01e9fe');
	});

	it('hashPassword rejects an empty or non-string password with TypeError', async () => {
		await expect(hashPassword('')).rejects.toThrow(TypeError);
		await expect(hashPassword(42 as unknown as string)).rejects.toThrow('password must be a non-empty string');
	});
});
