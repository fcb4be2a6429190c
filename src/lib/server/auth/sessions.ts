import { randomBytes } from 'node:crypto';
import { and, desc, eq, gt, isNull, lt, ne } from 'drizzle-orm';
import Bowser from 'bowser';
import { getDb } from '$lib/server/db';
import { sessions } from '$lib/server/db/schema';
import { ServiceError } from '$lib/server/errors';
import type { DbOrTx } from '$lib/server/db/transaction';

/**
 * Session lifetimes (OWASP Session Management Cheat Sheet, common practice: an idle and an absolute
 * timeout). The idle limit matches the Auth.js JWT's rolling maxAge.
 */
export const SESSION_IDLE_SECONDS = 7 * 24 * 3600;
export const SESSION_ABSOLUTE_SECONDS = 30 * 24 * 3600;
/** A session's last-seen time is written at most this often, not on every request. */
export const SESSION_TOUCH_MS = 60_000;

const USER_AGENT_MAX = 400;

export interface SessionOrigin {
	userAgent?: string | null;
	address?: string | null;
}

/** One of a user's active sessions as the account page lists it. */
export interface SessionView {
	id: string;
	/** "Firefox 128 on Linux", "curl 8.5", or "Unknown device". */
	device: string;
	address: string | null;
	createdAt: string;
	lastSeenAt: string;
	/** True for the session the request came with. */
	current: boolean;
}

function expiryOf(createdAt: number, lastSeen: number): Date {
	return new Date(Math.min(lastSeen + SESSION_IDLE_SECONDS * 1000, createdAt + SESSION_ABSOLUTE_SECONDS * 1000));
}

/** Opens a session for a user who has just signed in; returns its id, which the JWT carries. */
export function createSession(userId: string, origin: SessionOrigin = {}, now = Date.now(), db: DbOrTx = getDb()): string {
	const id = randomBytes(32).toString('base64url');
	db.insert(sessions)
		.values({
			sessionToken: id,
			userId,
			expires: expiryOf(now, now),
			createdAt: new Date(now),
			lastSeenAt: new Date(now),
			userAgent: origin.userAgent?.slice(0, USER_AGENT_MAX) ?? null,
			address: origin.address ?? null
		})
		.run();
	// Housekeeping: a user's sessions that ended long ago are of no further use.
	db.delete(sessions)
		.where(and(eq(sessions.userId, userId), lt(sessions.expires, new Date(now - SESSION_ABSOLUTE_SECONDS * 1000))))
		.run();
	return id;
}

/**
 * The user of a session when it is neither revoked nor expired, else undefined. Records the activity
 * (and pushes the idle expiry on) when the last record is older than SESSION_TOUCH_MS.
 */
export function checkSession(id: string | undefined | null, now = Date.now(), db: DbOrTx = getDb()): { userId: string } | undefined {
	if (typeof id !== 'string' || id.length === 0) return undefined;
	const row = db.select().from(sessions).where(eq(sessions.sessionToken, id)).get();
	if (!row || row.revokedAt || row.expires.getTime() <= now) return undefined;
	if (now - row.lastSeenAt.getTime() >= SESSION_TOUCH_MS) {
		db.update(sessions)
			.set({ lastSeenAt: new Date(now), expires: expiryOf(row.createdAt.getTime(), now) })
			.where(eq(sessions.sessionToken, id))
			.run();
	}
	return { userId: row.userId };
}

/** Ends one session (sign-out). Ending a session twice is harmless. */
export function revokeSession(id: string, now = Date.now(), db: DbOrTx = getDb()): void {
	db.update(sessions)
		.set({ revokedAt: new Date(now) })
		.where(and(eq(sessions.sessionToken, id), isNull(sessions.revokedAt)))
		.run();
}

/**
 * Ends every session of a user, or every one but `except` (the one the request came with). Used at a
 * password change or reset, when the user is disabled and for "end other sessions". Returns how many ended.
 */
export function revokeUserSessions(userId: string, { except, now = Date.now() }: { except?: string | null; now?: number } = {}, db: DbOrTx = getDb()): number {
	return db
		.update(sessions)
		.set({ revokedAt: new Date(now) })
		.where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt), except ? ne(sessions.sessionToken, except) : undefined))
		.run().changes;
}

/** Ends one of the user's own sessions by id; 404 when it is not theirs or already ended. */
export function revokeOwnSession(userId: string, id: string, now = Date.now(), db: DbOrTx = getDb()): void {
	const result = db
		.update(sessions)
		.set({ revokedAt: new Date(now) })
		.where(and(eq(sessions.sessionToken, id), eq(sessions.userId, userId), isNull(sessions.revokedAt)))
		.run();
	if (result.changes === 0) throw new ServiceError(404, 'That session has already ended.');
}

/** The user's active sessions, most recently seen first, the current one marked. */
export function listSessions(userId: string, currentId: string | null, now = Date.now(), db: DbOrTx = getDb()): SessionView[] {
	return db
		.select()
		.from(sessions)
		.where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt), gt(sessions.expires, new Date(now))))
		.orderBy(desc(sessions.lastSeenAt))
		.all()
		.map((s) => ({
			id: s.sessionToken,
			device: describeDevice(s.userAgent),
			address: s.address,
			createdAt: s.createdAt.toISOString(),
			lastSeenAt: s.lastSeenAt.toISOString(),
			current: s.sessionToken === currentId
		}))
		.sort((a, b) => Number(b.current) - Number(a.current));
}

/** A short, human name for the device behind a user agent: "Chrome 126 on Windows", "curl 8.5". */
export function describeDevice(userAgent: string | null | undefined): string {
	if (!userAgent) return 'Unknown device';
	const tool = /^(curl|Wget|python-requests|node-fetch|undici|HTTPie|PostmanRuntime)\/([\d.]+)/i.exec(userAgent);
	if (tool) return `${tool[1]} ${tool[2].split('.').slice(0, 2).join('.')}`;
	const { browser, os } = Bowser.parse(userAgent);
	const name = browser.name ? `${browser.name}${browser.version ? ` ${browser.version.split('.')[0]}` : ''}` : null;
	if (!name) return userAgent.length > 60 ? `${userAgent.slice(0, 57)}…` : userAgent;
	return os.name ? `${name} on ${os.name}` : name;
}

