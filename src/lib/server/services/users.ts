import { asc, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { passwordResets, users, type SiteRole, type User } from '$lib/server/db/schema';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';
import { generateToken, hashToken } from '$lib/server/auth/secrets';
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

export function setDisabled(actorId: string, userId: string, disabled: boolean): void {
	if (actorId === userId) throw new ServiceError(409, 'You cannot disable your own account.');
	const result = getDb().update(users).set({ disabled, updatedAt: new Date() }).where(eq(users.id, userId)).run();
	if (result.changes === 0) throw new ServiceError(404, 'User not found.');
}

export async function changePassword(userId: string, current: string, next: string): Promise<void> {
	const user = findUser(userId);
	if (!user) throw new ServiceError(404, 'User not found.');
	if (!(await verifyPassword(current, user.passwordHash))) {
		throw new ServiceError(400, 'The current password is not right.');
	}
	await setPassword(userId, next);
}

async function setPassword(userId: string, password: string): Promise<void> {
	const passwordHash = await hashPassword(password);
	getDb().update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, userId)).run();
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
			['An administrator sent you a link to choose a new Conefield password.', 'It works once, within one hour.'],
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

export async function resetPassword(token: string, password: string): Promise<User> {
	const reset = findPasswordReset(token);
	if (!reset) throw new ServiceError(404, 'This reset link has expired or was already used.');
	await setPassword(reset.user.id, password);
	getDb().update(passwordResets).set({ usedAt: new Date() }).where(eq(passwordResets.id, reset.id)).run();
	return reset.user;
}
