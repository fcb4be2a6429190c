import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type Db } from '$lib/server/db';
import { signInAttempts } from '$lib/server/db/schema';
import { checkThrottle, recordAttempt, throttleMessage } from '$lib/server/auth/throttle';

const T0 = Date.UTC(2026, 0, 1, 12, 0, 0);
const MINUTE = 60_000;
let db: Db;

beforeAll(() => {
	db = openDatabase(':memory:');
});
afterEach(() => {
	db.delete(signInAttempts).run();
});

describe('checkThrottle(db, email, address, now) with the defaults (5 per account, 20 per address, 15 min)', () => {
	it('allows 4 failures for an account and blocks at the 5th, for 15 minutes from the first', () => {
		for (let i = 0; i < 4; i++) recordAttempt(db, 'a@x.test', '10.0.0.1', false, T0 + i * MINUTE);
		expect(checkThrottle(db, 'a@x.test', '10.0.0.1', T0 + 4 * MINUTE).blocked).toBe(false);
		recordAttempt(db, 'a@x.test', '10.0.0.1', false, T0 + 4 * MINUTE);
		const state = checkThrottle(db, 'a@x.test', '10.0.0.9', T0 + 5 * MINUTE);
		expect(state).toEqual({ blocked: true, retryAfterSeconds: 600, reason: 'account' });
	});

	it('counts the account case-insensitively', () => {
		for (let i = 0; i < 5; i++) recordAttempt(db, 'Mixed@X.test', '10.0.0.1', false, T0);
		expect(checkThrottle(db, 'mixed@x.test', '10.0.0.2', T0 + 1).blocked).toBe(true);
	});

	it('lets the block lapse once the failures leave the window', () => {
		for (let i = 0; i < 5; i++) recordAttempt(db, 'a@x.test', '10.0.0.1', false, T0);
		expect(checkThrottle(db, 'a@x.test', '10.0.0.1', T0 + 15 * MINUTE - 1).blocked).toBe(true);
		expect(checkThrottle(db, 'a@x.test', '10.0.0.1', T0 + 15 * MINUTE).blocked).toBe(false);
	});

	it('ignores successful attempts', () => {
		for (let i = 0; i < 10; i++) recordAttempt(db, 'a@x.test', '10.0.0.1', true, T0);
		expect(checkThrottle(db, 'a@x.test', '10.0.0.1', T0 + 1).blocked).toBe(false);
	});

	it('blocks an address after 20 failures spread over many accounts, leaving other addresses alone', () => {
		for (let i = 0; i < 20; i++) recordAttempt(db, `user${i}@x.test`, '192.0.2.7', false, T0);
		expect(checkThrottle(db, 'fresh@x.test', '192.0.2.7', T0 + 1)).toMatchObject({ blocked: true, reason: 'address' });
		expect(checkThrottle(db, 'fresh@x.test', '192.0.2.8', T0 + 1).blocked).toBe(false);
	});

	it('throttleMessage names the cause and the wait in whole minutes', () => {
		expect(throttleMessage({ blocked: true, retryAfterSeconds: 600, reason: 'account' })).toBe(
			'Too many failed sign-in attempts for this account. Wait 10 minutes and try again, or use an e-mail link.'
		);
		expect(throttleMessage({ blocked: true, retryAfterSeconds: 30, reason: 'address' })).toContain('from this address. Wait 1 minute ');
	});
});
