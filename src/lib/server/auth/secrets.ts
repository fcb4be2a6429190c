import { createHash, randomBytes } from 'node:crypto';

/** A random token for links and API access: a short prefix (to recognise it in logs and configs) and 32 random bytes. */
export function generateToken(prefix = 'cf'): string {
	return `${prefix}_${randomBytes(32).toString('base64url')}`;
}

/** SHA-256 of a token, hex; the only form in which tokens are stored. */
export function hashToken(token: string): string {
	if (typeof token !== 'string' || token.length === 0) throw new TypeError('token must be a non-empty string');
	return createHash('sha256').update(token, 'utf8').digest('hex');
}
