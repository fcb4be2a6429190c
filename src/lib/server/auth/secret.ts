import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { dataDir } from '$lib/server/config';

/**
 * AUTH_SECRET from the environment, or one generated on first start and kept in <data>/auth-secret,
 * so sessions survive restarts of a local install. A deployment must set AUTH_SECRET.
 */
export function resolveAuthSecret(env: Record<string, string | undefined> = process.env): string {
	const fromEnv = env.AUTH_SECRET?.trim();
	if (fromEnv) return fromEnv;
	const dir = dataDir();
	const file = join(dir, 'auth-secret');
	if (existsSync(file)) {
		const stored = readFileSync(file, 'utf8').trim();
		if (stored) return stored;
	}
	mkdirSync(dir, { recursive: true });
	const secret = randomBytes(32).toString('base64url');
	writeFileSync(file, secret + '\n', { mode: 0o600 });
	console.warn(
		`[conefield] AUTH_SECRET is not set; generated one in ${file}. A deployment must set AUTH_SECRET.`
	);
	return secret;
}
