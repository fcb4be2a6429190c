import { and, asc, count, eq, gt, isNull } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { invitations, memberships, projects, users, type Project, type ProjectRole, type User } from '$lib/server/db/schema';
import { generateToken, hashToken } from '$lib/server/auth/secrets';
import { hashPassword } from '$lib/server/auth/password';
import { actionMail, sendMail } from '$lib/server/mail';
import { ServiceError } from '$lib/server/errors';
import type { DbOrTx } from '$lib/server/db/transaction';
import { recordAudit } from './audit';

const INVITATION_LIFETIME_MS = 7 * 24 * 3600 * 1000;

export interface MemberView {
	userId: string;
	email: string;
	name: string | null;
	role: ProjectRole;
}

export interface InvitationView {
	id: string;
	email: string;
	role: ProjectRole;
	expiresAt: string;
}

export function listMembers(projectId: string): MemberView[] {
	return getDb()
		.select({ userId: users.id, email: users.email, name: users.name, role: memberships.role })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.projectId, projectId))
		.orderBy(asc(users.email))
		.all();
}

/** Invitations that were neither accepted nor have expired. */
export function listPendingInvitations(projectId: string): InvitationView[] {
	return getDb()
		.select()
		.from(invitations)
		.where(
			and(eq(invitations.projectId, projectId), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date()))
		)
		.orderBy(asc(invitations.email))
		.all()
		.map((i) => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt.toISOString() }));
}

/**
 * Invites an address to a project with a role and mails it a one-time accept link (valid 7 days).
 * Inviting an existing member is a conflict; inviting the same address again replaces the earlier link.
 */
export async function inviteMember(
	project: Project,
	invitedBy: User | { id: string; name: string | null; email: string },
	email: string,
	role: ProjectRole,
	origin: string
): Promise<InvitationView> {
	const db = getDb();
	const already = db
		.select({ id: users.id })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.projectId, project.id), eq(users.email, email)))
		.get();
	if (already) throw new ServiceError(409, `${email} is already a member of this project.`);
	const token = generateToken('invite');
	const invitation = db.transaction((tx) => {
		tx.delete(invitations)
			.where(and(eq(invitations.projectId, project.id), eq(invitations.email, email), isNull(invitations.acceptedAt)))
			.run();
		const row = tx
			.insert(invitations)
			.values({
				projectId: project.id,
				email,
				role,
				tokenHash: hashToken(token),
				invitedBy: invitedBy.id,
				expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS)
			})
			.returning()
			.get();
		recordAudit(tx, { projectId: project.id, kind: 'member', action: 'invited', subject: email, subjectId: row.id, detail: `as ${role}`, userId: invitedBy.id });
		return row;
	});
	await sendMail(
		actionMail(
			email,
			`You are invited to “${project.name}” on Conefield`,
			[
				`${invitedBy.name ?? invitedBy.email} invited you to the project “${project.name}” as ${role}.`,
				'The link works once, within 7 days.'
			],
			{ label: 'Accept the invitation', url: `${origin}/invitations/${encodeURIComponent(token)}` }
		)
	);
	return { id: invitation.id, email, role, expiresAt: invitation.expiresAt.toISOString() };
}

export function revokeInvitation(projectId: string, invitationId: string): void {
	getDb().transaction((tx) => {
		const row = tx
			.delete(invitations)
			.where(and(eq(invitations.projectId, projectId), eq(invitations.id, invitationId), isNull(invitations.acceptedAt)))
			.returning({ email: invitations.email, role: invitations.role })
			.get();
		if (!row) throw new ServiceError(404, 'Invitation not found.');
		recordAudit(tx, { projectId, kind: 'member', action: 'withdrew the invitation of', subject: row.email, subjectId: invitationId, detail: `as ${row.role}` });
	});
}

export interface PendingInvitation {
	id: string;
	email: string;
	role: ProjectRole;
	project: { id: string; name: string };
}

/** The invitation behind a token, when it is unused and unexpired. */
export function findInvitation(token: string): PendingInvitation | undefined {
	const row = getDb()
		.select({ invitation: invitations, project: projects })
		.from(invitations)
		.innerJoin(projects, eq(projects.id, invitations.projectId))
		.where(eq(invitations.tokenHash, hashToken(token)))
		.get();
	if (!row || row.invitation.acceptedAt || row.invitation.expiresAt.getTime() < Date.now()) return undefined;
	const { id, email, role } = row.invitation;
	return { id, email, role, project: { id: row.project.id, name: row.project.name } };
}

/**
 * Claims an invitation for use: one conditional UPDATE (unused and unexpired) inside the caller's
 * transaction, so of several concurrent requests exactly one gets it.
 * @throws ServiceError 409 when the invitation was already used, 404 when it is unknown or expired.
 */
function claimInvitation(tx: DbOrTx, tokenHash: string, at: Date): typeof invitations.$inferSelect {
	const claimed = tx
		.update(invitations)
		.set({ acceptedAt: at })
		.where(and(eq(invitations.tokenHash, tokenHash), isNull(invitations.acceptedAt), gt(invitations.expiresAt, at)))
		.returning()
		.get();
	if (claimed) return claimed;
	const row = tx.select({ acceptedAt: invitations.acceptedAt }).from(invitations).where(eq(invitations.tokenHash, tokenHash)).get();
	if (row?.acceptedAt) throw new ServiceError(409, 'This invitation was already used. Sign in to open the project.');
	throw new ServiceError(404, 'This invitation has expired or was already used.');
}

/**
 * Makes the signed-in user a member with the invited role (keeping a higher role they already hold) and
 * closes the invitation, claiming it atomically first.
 */
export function acceptInvitation(token: string, user: { id: string; email: string }): PendingInvitation {
	const tokenHash = hashToken(token);
	const row = getDb()
		.select({ invitation: invitations, project: projects })
		.from(invitations)
		.innerJoin(projects, eq(projects.id, invitations.projectId))
		.where(eq(invitations.tokenHash, tokenHash))
		.get();
	if (!row) throw new ServiceError(404, 'This invitation has expired or was already used.');
	const { id, email, role } = row.invitation;
	if (email !== user.email.toLowerCase()) {
		throw new ServiceError(403, `This invitation is for ${email}. Sign in with that address to accept it.`);
	}
	getDb().transaction((tx) => {
		claimInvitation(tx, tokenHash, new Date());
		const added = tx.insert(memberships).values({ projectId: row.project.id, userId: user.id, role }).onConflictDoNothing().run().changes;
		recordAudit(tx, { projectId: row.project.id, kind: 'member', action: 'joined', subject: user.email, subjectId: user.id, detail: added ? `as ${role}, by invitation` : 'by invitation (already a member)', userId: user.id });
	});
	return { id, email, role, project: { id: row.project.id, name: row.project.name } };
}

/**
 * Someone new registers through an invitation: the invitation is claimed atomically before the password is
 * hashed, so concurrent registrations from one link give one account and 409 for the others; then the
 * account and the membership are written in one transaction. Should that fail, the claim is released.
 * @throws ServiceError 404 unknown or expired, 409 already used or the address already has an account.
 */
export async function registerFromInvitation(token: string, input: { name: string; password: string }): Promise<{ user: User; invitation: PendingInvitation }> {
	const db = getDb();
	const claimedAt = new Date();
	const claimed = db.transaction((tx) => {
		const row = claimInvitation(tx, hashToken(token), claimedAt);
		if (tx.select({ id: users.id }).from(users).where(eq(users.email, row.email)).get()) {
			throw new ServiceError(409, 'An account with this e-mail address already exists. Sign in, then open the invitation again.');
		}
		return row;
	});
	const release = () =>
		db.update(invitations).set({ acceptedAt: null }).where(and(eq(invitations.id, claimed.id), eq(invitations.acceptedAt, claimedAt))).run();
	try {
		const passwordHash = await hashPassword(input.password);
		return db.transaction((tx) => {
			const user = tx
				.insert(users)
				.values({ email: claimed.email, name: input.name, passwordHash, emailVerified: claimedAt })
				.returning()
				.get();
			tx.insert(memberships).values({ projectId: claimed.projectId, userId: user.id, role: claimed.role }).run();
			recordAudit(tx, { projectId: claimed.projectId, kind: 'member', action: 'joined', subject: user.email, subjectId: user.id, detail: `as ${claimed.role}, by invitation (new account)`, userId: user.id });
			const project = tx.select({ id: projects.id, name: projects.name }).from(projects).where(eq(projects.id, claimed.projectId)).get()!;
			return { user, invitation: { id: claimed.id, email: claimed.email, role: claimed.role, project } };
		});
	} catch (err) {
		release();
		if (err instanceof Error && /UNIQUE constraint failed: users\.email/.test(err.message)) {
			throw new ServiceError(409, 'An account with this e-mail address already exists. Sign in, then open the invitation again.');
		}
		throw err;
	}
}

function ownerCount(projectId: string): number {
	return (
		getDb()
			.select({ n: count() })
			.from(memberships)
			.where(and(eq(memberships.projectId, projectId), eq(memberships.role, 'owner')))
			.get()?.n ?? 0
	);
}

function membership(projectId: string, userId: string) {
	const row = getDb()
		.select()
		.from(memberships)
		.where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)))
		.get();
	if (!row) throw new ServiceError(404, 'Member not found.');
	return row;
}

/** Changes a member's role; a project always keeps at least one owner. */
export function changeMemberRole(projectId: string, userId: string, role: ProjectRole): void {
	const current = membership(projectId, userId);
	if (current.role === 'owner' && role !== 'owner' && ownerCount(projectId) <= 1) {
		throw new ServiceError(409, 'A project needs at least one owner. Make someone else owner first.');
	}
	getDb().transaction((tx) => {
		tx.update(memberships)
			.set({ role })
			.where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)))
			.run();
		recordAudit(tx, { projectId, kind: 'member', action: 'changed the role of', subject: emailOf(tx, userId), subjectId: userId, detail: `${current.role} → ${role}` });
	});
}

/** Removes a member; the last owner cannot be removed. */
export function removeMember(projectId: string, userId: string): void {
	const current = membership(projectId, userId);
	if (current.role === 'owner' && ownerCount(projectId) <= 1) {
		throw new ServiceError(409, 'A project needs at least one owner. Make someone else owner first.');
	}
	getDb().transaction((tx) => {
		tx.delete(memberships)
			.where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)))
			.run();
		recordAudit(tx, { projectId, kind: 'member', action: 'removed', subject: emailOf(tx, userId), subjectId: userId, detail: `was ${current.role}` });
	});
}

function emailOf(tx: DbOrTx, userId: string): string {
	return tx.select({ email: users.email }).from(users).where(eq(users.id, userId)).get()?.email ?? userId;
}
