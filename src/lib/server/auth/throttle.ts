import { and, count, eq, gt, min } from 'drizzle-orm';
import type { Db } from '$lib/server/db';
import { signInAttempts } from '$lib/server/db/schema';
import { throttleSettings } from '$lib/server/config';

export interface ThrottleState {
	blocked: boolean;
	/** Seconds until the oldest counted failure leaves the window; 0 when not blocked. */
	retryAfterSeconds: number;
	reason?: 'account' | 'address';
}

/**
 * Whether password sign-in for `email` from `address` is currently refused: more than the allowed number
 * of failures inside the sliding window, counted per account and per address (common practice, cf. OWASP
 * Authentication Cheat Sheet). A successful sign-in does not clear earlier failures of the address.
 */
export function checkThrottle(db: Db, email: string, address: string, now = Date.now()): ThrottleState {
	const { windowMs, maxPerAccount, maxPerAddress } = throttleSettings();
	const since = new Date(now - windowMs);
	const failures = (column: typeof signInAttempts.email | typeof signInAttempts.address, value: string) =>
		db
			.select({ n: count(), oldest: min(signInAttempts.attemptedAt) })
			.from(signInAttempts)
			.where(and(eq(column, value), eq(signInAttempts.success, false), gt(signInAttempts.attemptedAt, since)))
			.get() ?? { n: 0, oldest: null };
	const retry = (oldest: Date | null) =>
		Math.max(1, Math.ceil(((oldest ? oldest.getTime() : now) + windowMs - now) / 1000));
	const byAccount = failures(signInAttempts.email, email.toLowerCase());
	if (byAccount.n >= maxPerAccount) return { blocked: true, retryAfterSeconds: retry(byAccount.oldest), reason: 'account' };
	const byAddress = failures(signInAttempts.address, address);
	if (byAddress.n >= maxPerAddress) return { blocked: true, retryAfterSeconds: retry(byAddress.oldest), reason: 'address' };
	return { blocked: false, retryAfterSeconds: 0 };
}

export function recordAttempt(db: Db, email: string, address: string, success: boolean, now = Date.now()): void {
	db.insert(signInAttempts)
		.values({ email: email.toLowerCase(), address, success, attemptedAt: new Date(now) })
		.run();
}

/** The message shown when sign-in is throttled. */
export function throttleMessage(state: ThrottleState): string {
	const minutes = Math.max(1, Math.ceil(state.retryAfterSeconds / 60));
	const who = state.reason === 'address' ? 'from this address' : 'for this account';
	return `Too many failed sign-in attempts ${who}. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or use an e-mail link.`;
}
