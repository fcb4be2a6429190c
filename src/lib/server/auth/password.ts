import { randomBytes, scrypt as scryptCallback, timingSafeEqual, type ScryptOptions } from 'node:crypto';

/** scrypt cost parameters (N = 2^14, r = 8, p = 1): the interactive-login values of Percival (2009). */
const PARAMS = { N: 16384, r: 8, p: 1 } as const;
const KEY_LENGTH = 64;
const SALT_BYTES = 16;

function scrypt(password: string, salt: Buffer, keylen: number, options: ScryptOptions): Promise<Buffer> {
	return new Promise((resolve, reject) =>
		scryptCallback(password.normalize('NFKC'), salt, keylen, options, (err, key) =>
			err ? reject(err) : resolve(key)
		)
	);
}

/**
 * Hashes a password with scrypt and a fresh random salt.
 * The result carries its parameters, `scrypt$N$r$p$salt$hash` (base64), so they can be raised later.
 */
export async function hashPassword(password: string): Promise<string> {
	if (typeof password !== 'string' || password.length === 0) throw new TypeError('password must be a non-empty string');
	const salt = randomBytes(SALT_BYTES);
	const key = await scrypt(password, salt, KEY_LENGTH, { ...PARAMS, maxmem: 64 * 1024 * 1024 });
	return ['scrypt', PARAMS.N, PARAMS.r, PARAMS.p, salt.toString('base64'), key.toString('base64')].join('$');
}

/** Checks a password against a stored hash in constant time; a malformed hash never matches. */
export async function verifyPassword(password: string, stored: string | null | undefined): Promise<boolean> {
	if (!stored || typeof password !== 'string') return false;
	const parts = stored.split('$');
	if (parts.length !== 6 || parts[0] !== 'scrypt') return false;
	const [N, r, p] = parts.slice(1, 4).map(Number);
	if (![N, r, p].every(Number.isInteger)) return false;
	const salt = Buffer.from(parts[4], 'base64');
	const expected = Buffer.from(parts[5], 'base64');
	if (expected.length === 0) return false;
	const actual = await scrypt(password, salt, expected.length, { N, r, p, maxmem: 256 * 1024 * 1024 });
	return timingSafeEqual(actual, expected);
}

/**
 * A hash of nothing, checked when the account does not exist so that a wrong e-mail
 * takes as long as a wrong password.
 */
let dummy: Promise<string> | undefined;
export function dummyHash(): Promise<string> {
	dummy ??= hashPassword('conefield-no-such-account');
	return dummy;
}
