import { resolve } from 'node:path';

/** The directory for runtime state (auth secret, default database): DATA_DIR or ./data. */
export function dataDir(): string {
	return resolve(process.env.DATA_DIR ?? 'data');
}

function intFromEnv(name: string, fallback: number): number {
	const value = Number(process.env[name]);
	return Number.isInteger(value) && value > 0 ? value : fallback;
}

/** Sign-in throttling: failures allowed per window, per account and per client address. */
export function throttleSettings() {
	return {
		windowMs: intFromEnv('SIGNIN_WINDOW_MINUTES', 15) * 60_000,
		maxPerAccount: intFromEnv('SIGNIN_MAX_FAILURES_PER_ACCOUNT', 5),
		maxPerAddress: intFromEnv('SIGNIN_MAX_FAILURES_PER_ADDRESS', 20)
	};
}

export function mailFrom(): string {
	return process.env.MAIL_FROM ?? 'Conefield <no-reply@conefield.test>';
}

/**
 * Whether to seed the demo accounts and project into an empty database. Off unless SEED_DEMO is 1/true/yes/on:
 * `npm start` (the local quick start) and the test server switch it on; a bare `node build/index.js` does not,
 * because the demo passwords are public.
 */
export function seedDemoEnabled(env: Record<string, string | undefined> = process.env): boolean {
	return /^(1|true|yes|on)$/i.test(env.SEED_DEMO?.trim() ?? '');
}

/** The address of the first site administrator of a deployment (ADMIN_EMAIL), or null. */
export function initialAdminEmail(env: Record<string, string | undefined> = process.env): string | null {
	const value = env.ADMIN_EMAIL?.trim().toLowerCase();
	return value ? value : null;
}
