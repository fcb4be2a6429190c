import { beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { openDatabase, type Db } from '$lib/server/db';
import { sessions, users } from '$lib/server/db/schema';
import {
	checkSession,
	createSession,
	describeDevice,
	listSessions,
	revokeOwnSession,
	revokeSession,
	revokeUserSessions,
	SESSION_ABSOLUTE_SECONDS,
	SESSION_IDLE_SECONDS,
	SESSION_TOUCH_MS
} from '$lib/server/auth/sessions';
import { ServiceError } from '$lib/server/errors';

let db: Db;
let alice: string;
let bob: string;
const T0 = Date.UTC(2026, 0, 5, 9, 0, 0);
const lastSeen = (id: string) => db.select().from(sessions).where(eq(sessions.sessionToken, id)).get()!.lastSeenAt.getTime();

beforeEach(() => {
	db = openDatabase(':memory:');
	alice = db.insert(users).values({ email: 'alice@example.test', name: 'Alice' }).returning().get().id;
	bob = db.insert(users).values({ email: 'bob@example.test', name: 'Bob' }).returning().get().id;
});

describe('createSession and checkSession', () => {
	it('checkSession(id) names the user of a fresh session and nothing for an unknown, empty or missing id', () => {
		const id = createSession(alice, { userAgent: 'curl/8.5.0', address: '127.0.0.1' }, T0, db);
		expect(id).toMatch(/^[\w-]{43}$/);
		expect(checkSession(id, T0, db)).toEqual({ userId: alice });
		expect(checkSession('no-such-session', T0, db)).toBeUndefined();
		expect(checkSession('', T0, db)).toBeUndefined();
		expect(checkSession(undefined, T0, db)).toBeUndefined();
	});

	it('checkSession writes the last-seen time at most once per SESSION_TOUCH_MS', () => {
		const id = createSession(alice, {}, T0, db);
		checkSession(id, T0 + SESSION_TOUCH_MS - 1, db);
		expect(lastSeen(id)).toBe(T0);
		checkSession(id, T0 + SESSION_TOUCH_MS, db);
		expect(lastSeen(id)).toBe(T0 + SESSION_TOUCH_MS);
	});

	it('a session ends after SESSION_IDLE_SECONDS without use, and at SESSION_ABSOLUTE_SECONDS however busy', () => {
		const idle = createSession(alice, {}, T0, db);
		expect(checkSession(idle, T0 + SESSION_IDLE_SECONDS * 1000 - 1, db)).toBeDefined();
		const quiet = createSession(alice, {}, T0, db);
		expect(checkSession(quiet, T0 + SESSION_IDLE_SECONDS * 1000, db)).toBeUndefined();
		const busy = createSession(alice, {}, T0, db);
		for (let t = T0; t < T0 + SESSION_ABSOLUTE_SECONDS * 1000; t += 24 * 3600 * 1000) expect(checkSession(busy, t, db)).toBeDefined();
		expect(checkSession(busy, T0 + SESSION_ABSOLUTE_SECONDS * 1000, db)).toBeUndefined();
	});
});

describe('revoking', () => {
	it('revokeSession ends one session; ending it twice is harmless', () => {
		const a = createSession(alice, {}, T0, db);
		const b = createSession(alice, {}, T0, db);
		revokeSession(a, T0, db);
		revokeSession(a, T0, db);
		expect(checkSession(a, T0, db)).toBeUndefined();
		expect(checkSession(b, T0, db)).toBeDefined();
	});

	it('revokeUserSessions ends all of one user’s sessions but `except`, and no one else’s', () => {
		const [a1, a2, a3] = [0, 1, 2].map(() => createSession(alice, {}, T0, db));
		const b1 = createSession(bob, {}, T0, db);
		expect(revokeUserSessions(alice, { except: a2, now: T0 }, db)).toBe(2);
		expect([a1, a2, a3].map((id) => !!checkSession(id, T0, db))).toEqual([false, true, false]);
		expect(checkSession(b1, T0, db)).toBeDefined();
		expect(revokeUserSessions(alice, { now: T0 }, db)).toBe(1);
	});

	it('revokeOwnSession refuses another user’s session with 404 and leaves it alone', () => {
		const b1 = createSession(bob, {}, T0, db);
		expect(() => revokeOwnSession(alice, b1, T0, db)).toThrow(ServiceError);
		expect(checkSession(b1, T0, db)).toBeDefined();
		revokeOwnSession(bob, b1, T0, db);
		expect(checkSession(b1, T0, db)).toBeUndefined();
	});
});

describe('listSessions(userId, currentId)', () => {
	it('lists only active sessions, the current one first and marked, with a device name', () => {
		const phone = createSession(alice, { userAgent: 'Mozilla/5.0 (Android 14; Mobile; rv:128.0) Gecko/128.0 Firefox/128.0' }, T0, db);
		const laptop = createSession(alice, { userAgent: 'Mozilla/5.0 (X11; Linux x86_64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0.0.0 Safari/537.36' }, T0 + 1000, db);
		revokeSession(createSession(alice, {}, T0, db), T0, db);
		createSession(bob, {}, T0, db);
		const list = listSessions(alice, phone, T0 + 2000, db);
		expect(list.map((s) => [s.id, s.current, s.device])).toEqual([
			[phone, true, 'Firefox 128 on Android'],
			[laptop, false, 'Chrome 126 on Linux']
		]);
	});
});

describe('describeDevice(userAgent)', () => {
	it('names browsers with their OS, command-line tools with their version, and nothing as an unknown device', () => {
		expect(describeDevice('Mozilla/5.0 (Windows NT 10.0; Win64; x64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0.0.0 Safari/537.36 Edg/126.0.0.0')).toBe('Microsoft Edge 126 on Windows');
		expect(describeDevice('curl/8.5.0')).toBe('curl 8.5');
		expect(describeDevice('python-requests/2.32.3')).toBe('python-requests 2.32');
		expect(describeDevice(null)).toBe('Unknown device');
		expect(describeDevice('x'.repeat(200))).toHaveLength(58);
	});
});
