import { and, asc, eq, gt, inArray, isNull } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { passwordResets, users, type SiteRole, type User } from '$lib/server/db/schema';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';
import { generateToken, hashToken } from '$lib/server/auth/secrets';
import { revokeUserSessions } from '$lib/server/auth/sessions';
import { actionMail, sendMail } from '$lib/server/mail';
import { ServiceError } from '$lib/server/errors';

const RESET_LIFETIME_MS = 60 * 60 * 1000;

/** The fields of a user that may leave the server. */
export interface PublicUser {
	id: string;
	email: string;
	name: string | null;
	siteRole: SiteRole;
	disabled: boolean;
}

export function publicUser(u: User): PublicUser {
	return { id: u.id, email: u.email, name: u.name, siteRole: u.siteRole, disabled: u.disabled };
}

export async function createUser(input: {
	email: string;
	name: string;
	password?: string;
	siteRole?: SiteRole;
	emailVerified?: boolean;
}): Promise<User> {
	const db = getDb();
	const email = input.email.trim().toLowerCase();
	if (db.select({ id: users.id }).from(users).where(eq(users.email, email)).get()) {
		throw new ServiceError(409, 'An account with this e-mail address already exists.');
	}
	const passwordHash = input.password ? await hashPassword(input.password) : null;
	return db
		.insert(users)
		.values({
			email,
			name: input.name,
			passwordHash,
			siteRole: input.siteRole ?? 'member',
			emailVerified: input.emailVerified ? new Date() : null
		})
		.returning()
		.get();
}

export function findUserByEmail(email: string): User | undefined {
	return getDb().select().from(users).where(eq(users.email, email.trim().toLowerCase())).get();
}

export function findUser(id: string): User | undefined {
	return getDb().select().from(users).where(eq(users.id, id)).get();
}

export function listUsers(): PublicUser[] {
	return getDb().select().from(users).orderBy(asc(users.email)).all().map(publicUser);
}

/** Disables or re-enables an account; disabling ends all of the user's sessions. */
export function setDisabled(actorId: string, userId: string, disabled: boolean): void {
	if (actorId === userId) throw new ServiceError(409, 'You cannot disable your own account.');
	const db = getDb();
	db.transaction((tx) => {
		const result = tx.update(users).set({ disabled, updatedAt: new Date() }).where(eq(users.id, userId)).run();
		if (result.changes === 0) throw new ServiceError(404, 'User not found.');
		if (disabled) revokeUserSessions(userId, {}, tx);
	});
}

/**
 * Changes the signed-in user's own password after checking the current one, and ends their other sessions
 * (the one making the change, `currentSessionId`, stays signed in).
 */
export async function changePassword(userId: string, current: string, next: string, currentSessionId: string | null = null): Promise<void> {
	const user = findUser(userId);
	if (!user) throw new ServiceError(404, 'User not found.');
	if (!(await verifyPassword(current, user.passwordHash))) {
		throw new ServiceError(400, 'The current password is not right.');
	}
	const passwordHash = await hashPassword(next);
	getDb().transaction((tx) => {
		tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, userId)).run();
		revokeUserSessions(userId, { except: currentSessionId }, tx);
	});
}

/** Mails a one-time password-reset link (valid one hour) to the user. */
export async function sendPasswordReset(userId: string, origin: string): Promise<void> {
	const user = findUser(userId);
	if (!user) throw new ServiceError(404, 'User not found.');
	const token = generateToken('reset');
	getDb()
		.insert(passwordResets)
		.values({ userId, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + RESET_LIFETIME_MS) })
		.run();
	await sendMail(
		actionMail(
			user.email,
			'Reset your Conefield password',
			['A link to choose a new Conefield password was requested for your account.', 'It works once, within one hour.'],
			{ label: 'Choose a new password', url: `${origin}/reset-password/${encodeURIComponent(token)}` }
		)
	);
}

/** The user a reset token belongs to, when it is unused and unexpired. */
export function findPasswordReset(token: string): { id: string; user: User } | undefined {
	const row = getDb()
		.select({ reset: passwordResets, user: users })
		.from(passwordResets)
		.innerJoin(users, eq(users.id, passwordResets.userId))
		.where(eq(passwordResets.tokenHash, hashToken(token)))
		.get();
	if (!row || row.reset.usedAt || row.reset.expiresAt.getTime() < Date.now() || row.user.disabled) return undefined;
	return { id: row.reset.id, user: row.user };
}

/**
 * Sets a new password through a reset link, once. The link is claimed first, atomically — one conditional
 * UPDATE (unused, unexpired, user enabled) inside a transaction — so of several concurrent requests exactly
 * one proceeds to hash its password; the others get 409. All of the user's sessions end. Should the update
 * fail after the claim, the claim is released so the link still works.
 * @throws ServiceError 404 for an unknown or expired link, 409 for one already used.
 */
export async function resetPassword(token: string, password: string): Promise<User> {
	const db = getDb();
	const tokenHash = hashToken(token);
	const claimedAt = new Date();
	const claimed = db.transaction((tx) =>
		tx
			.update(passwordResets)
			.set({ usedAt: claimedAt })
			.where(
				and(
					eq(passwordResets.tokenHash, tokenHash),
					isNull(passwordResets.usedAt),
					gt(passwordResets.expiresAt, claimedAt),
					inArray(passwordResets.userId, tx.select({ id: users.id }).from(users).where(eq(users.disabled, false)))
				)
			)
			.returning({ id: passwordResets.id, userId: passwordResets.userId })
			.get()
	);
	if (!claimed) {
		const row = db.select({ usedAt: passwordResets.usedAt }).from(passwordResets).where(eq(passwordResets.tokenHash, tokenHash)).get();
		if (row?.usedAt) throw new ServiceError(409, 'This reset link was already used. Ask an administrator for a new one.');
		throw new ServiceError(404, 'This reset link has expired or was already used.');
	}
	try {
		const passwordHash = await hashPassword(password);
		return db.transaction((tx) => {
			const user = tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, claimed.userId)).returning().get();
			revokeUserSessions(claimed.userId, {}, tx);
			return user;
		});
	} catch (err) {
		db.update(passwordResets).set({ usedAt: null }).where(and(eq(passwordResets.id, claimed.id), eq(passwordResets.usedAt, claimedAt))).run();
		throw err;
	}
}

/**
 * A deployment's first administrator (ADMIN_EMAIL): created without a password when no account has that
 * address, and mailed a link to choose one for as long as it has none (so a restart sends a fresh link).
 */
export async function ensureInitialAdmin(email: string, origin: string): Promise<void> {
	const existing = findUserByEmail(email);
	const admin = existing ?? (await createUser({ email, name: email.split('@')[0], siteRole: 'admin', emailVerified: true }));
	if (existing && existing.siteRole !== 'admin') {
		console.warn(`[conefield] ADMIN_EMAIL ${email} belongs to an account that is not an administrator; left as it is.`);
		return;
	}
	if (admin.passwordHash) return;
	await sendPasswordReset(admin.id, origin);
	console.info(`[conefield] mailed a link to choose a password to the administrator ${email}.`);
}
