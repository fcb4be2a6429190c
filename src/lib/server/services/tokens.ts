import { and, desc, eq, isNull } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { apiTokens, users, type User } from '$lib/server/db/schema';
import { generateToken, hashToken } from '$lib/server/auth/secrets';
import { ServiceError } from '$lib/server/errors';

const DAY_MS = 24 * 3600 * 1000;

export interface ApiTokenView {
	id: string;
	name: string;
	createdAt: string;
	expiresAt: string;
	lastUsedAt: string | null;
	revokedAt: string | null;
	active: boolean;
}

/** Creates a personal API token. The plain token is returned this once; only its SHA-256 is stored. */
export function createApiToken(userId: string, name: string, expiresInDays: number): { token: string; view: ApiTokenView } {
	const token = generateToken('cf');
	const row = getDb()
		.insert(apiTokens)
		.values({ userId, name, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + expiresInDays * DAY_MS) })
		.returning()
		.get();
	return { token, view: tokenView(row) };
}

function tokenView(t: typeof apiTokens.$inferSelect, now = Date.now()): ApiTokenView {
	return {
		id: t.id,
		name: t.name,
		createdAt: t.createdAt.toISOString(),
		expiresAt: t.expiresAt.toISOString(),
		lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
		revokedAt: t.revokedAt?.toISOString() ?? null,
		active: !t.revokedAt && t.expiresAt.getTime() > now
	};
}

export function listApiTokens(userId: string): ApiTokenView[] {
	return getDb()
		.select()
		.from(apiTokens)
		.where(eq(apiTokens.userId, userId))
		.orderBy(desc(apiTokens.createdAt))
		.all()
		.map((t) => tokenView(t));
}

export function revokeApiToken(userId: string, tokenId: string): void {
	const result = getDb()
		.update(apiTokens)
		.set({ revokedAt: new Date() })
		.where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
		.run();
	if (result.changes === 0) throw new ServiceError(404, 'Token not found or already revoked.');
}

/** The enabled user owning an active token, recording the use; undefined for unknown, expired or revoked tokens. */
export function userForApiToken(token: string, now = Date.now()): User | undefined {
	const row = getDb()
		.select({ token: apiTokens, user: users })
		.from(apiTokens)
		.innerJoin(users, eq(users.id, apiTokens.userId))
		.where(eq(apiTokens.tokenHash, hashToken(token)))
		.get();
	if (!row || row.token.revokedAt || row.token.expiresAt.getTime() <= now || row.user.disabled) return undefined;
	getDb().update(apiTokens).set({ lastUsedAt: new Date(now) }).where(eq(apiTokens.id, row.token.id)).run();
	return row.user;
}
