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
