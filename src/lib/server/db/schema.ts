import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { AUDIT_KINDS } from '../../audit';

/** Epoch-millisecond timestamps; SQLite has no date type. */
export const timestamp = (name: string) => integer(name, { mode: 'timestamp_ms' });
export const now = sql`(cast(unixepoch('subsec') * 1000 as integer))`;
/** A text primary key filled with a random UUID. */
export const uuidKey = () =>
	text('id')
		.primaryKey()
		.$defaultFn(() => crypto.randomUUID());
/** The id of the project a row belongs to; the row goes when its project is deleted. */
export const projectRef = () =>
	text('project_id')
		.notNull()
		.references(() => projects.id, { onDelete: 'cascade' });

export const SITE_ROLES = ['admin', 'member'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

/** Ordered from least to most privileged; the order is what `hasRole` compares. */
export const PROJECT_ROLES = ['viewer', 'reviewer', 'analyst', 'owner'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

export const LENGTH_UNITS = ['m', 'ft'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/** Users; the first five columns are the ones @auth/drizzle-adapter reads and writes. */
export const users = sqliteTable('users', {
	id: uuidKey(),
	name: text('name'),
	email: text('email').notNull().unique(),
	emailVerified: timestamp('email_verified'),
	image: text('image'),
	passwordHash: text('password_hash'),
	siteRole: text('site_role', { enum: SITE_ROLES }).notNull().default('member'),
	disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
	createdAt: timestamp('created_at').notNull().default(now),
	updatedAt: timestamp('updated_at').notNull().default(now)
});

/** Required by the Auth.js adapter; unused by the e-mail and password providers but kept for its contract. */
export const accounts = sqliteTable(
	'accounts',
	{
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		type: text('type').$type<'email' | 'oauth' | 'oidc' | 'webauthn'>().notNull(),
		provider: text('provider').notNull(),
		providerAccountId: text('provider_account_id').notNull(),
		refresh_token: text('refresh_token'),
		access_token: text('access_token'),
		expires_at: integer('expires_at'),
		token_type: text('token_type'),
		scope: text('scope'),
		id_token: text('id_token'),
		session_state: text('session_state')
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

/**
 * Signed-in sessions. Auth.js keeps its JWT strategy (the Credentials provider needs it), and every JWT names
 * one of these rows by `session_token`; a request is signed in only while its row is neither revoked nor
 * expired, so signing out, a password change or reset, disabling and "end other sessions" take effect at the
 * next request. The first three columns are the Auth.js adapter's (unused under JWT sessions).
 */
export const sessions = sqliteTable(
	'sessions',
	{
		sessionToken: text('session_token').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		/** End of the session: the last activity plus the idle limit, never past the absolute limit. */
		expires: timestamp('expires').notNull(),
		createdAt: timestamp('created_at').notNull().default(now),
		lastSeenAt: timestamp('last_seen_at').notNull().default(now),
		userAgent: text('user_agent'),
		address: text('address'),
		revokedAt: timestamp('revoked_at')
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

/** Magic-link tokens (Auth.js stores them hashed). */
export const verificationTokens = sqliteTable(
	'verification_tokens',
	{
		identifier: text('identifier').notNull(),
		token: text('token').notNull(),
		expires: timestamp('expires').notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

export const projects = sqliteTable('projects', {
	id: uuidKey(),
	name: text('name').notNull(),
	description: text('description').notNull().default(''),
	lengthUnit: text('length_unit', { enum: LENGTH_UNITS }).notNull().default('m'),
	createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
	createdAt: timestamp('created_at').notNull().default(now),
	updatedAt: timestamp('updated_at').notNull().default(now)
});

export const memberships = sqliteTable(
	'memberships',
	{
		projectId: projectRef(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		role: text('role', { enum: PROJECT_ROLES }).notNull(),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [primaryKey({ columns: [t.projectId, t.userId] }), index('memberships_user_idx').on(t.userId)]
);

export const invitations = sqliteTable(
	'invitations',
	{
		id: uuidKey(),
		projectId: projectRef(),
		email: text('email').notNull(),
		role: text('role', { enum: PROJECT_ROLES }).notNull(),
		tokenHash: text('token_hash').notNull().unique(),
		invitedBy: text('invited_by').references(() => users.id, { onDelete: 'set null' }),
		expiresAt: timestamp('expires_at').notNull(),
		acceptedAt: timestamp('accepted_at'),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [index('invitations_project_idx').on(t.projectId)]
);

export const apiTokens = sqliteTable(
	'api_tokens',
	{
		id: uuidKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		tokenHash: text('token_hash').notNull(),
		expiresAt: timestamp('expires_at').notNull(),
		revokedAt: timestamp('revoked_at'),
		lastUsedAt: timestamp('last_used_at'),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('api_tokens_hash_idx').on(t.tokenHash), index('api_tokens_user_idx').on(t.userId)]
);

export const passwordResets = sqliteTable('password_resets', {
	id: uuidKey(),
	userId: text('user_id')
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	tokenHash: text('token_hash').notNull().unique(),
	expiresAt: timestamp('expires_at').notNull(),
	usedAt: timestamp('used_at'),
	createdAt: timestamp('created_at').notNull().default(now)
});

/** Every message the local SMTP sink received. */
export const outbox = sqliteTable(
	'outbox',
	{
		id: integer('id').primaryKey({ autoIncrement: true }),
		from: text('from').notNull(),
		to: text('to').notNull(),
		subject: text('subject').notNull(),
		text: text('text').notNull(),
		html: text('html'),
		receivedAt: timestamp('received_at').notNull().default(now)
	},
	(t) => [index('outbox_received_idx').on(t.receivedAt)]
);

/** Password sign-in attempts, kept for throttling per account and per address. */
export const signInAttempts = sqliteTable(
	'sign_in_attempts',
	{
		id: integer('id').primaryKey({ autoIncrement: true }),
		email: text('email').notNull(),
		address: text('address').notNull(),
		success: integer('success', { mode: 'boolean' }).notNull(),
		attemptedAt: timestamp('attempted_at').notNull().default(now)
	},
	(t) => [
		index('sign_in_attempts_email_idx').on(t.email, t.attemptedAt),
		index('sign_in_attempts_address_idx').on(t.address, t.attemptedAt)
	]
);

/**
 * The project's audit log: who did what and when. Each entry is written in the same transaction as the change
 * it records (recordAudit), so a change that fails leaves no entry. The person's name is kept beside the
 * reference, so the log still reads after an account is deleted.
 */
export const auditLog = sqliteTable(
	'audit_log',
	{
		id: integer('id').primaryKey({ autoIncrement: true }),
		projectId: projectRef(),
		at: timestamp('at').notNull().default(now),
		userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
		userName: text('user_name'),
		kind: text('kind', { enum: AUDIT_KINDS }).notNull(),
		/** A past-tense verb: uploaded, deleted, created, changed, approved … */
		action: text('action').notNull(),
		/** What it was done to, by name (a sounding, a unit, a recipe …). */
		subject: text('subject').notNull(),
		subjectId: text('subject_id'),
		/** Particulars in words ("3 soundings", "role analyst → reviewer", the recipe's hash …). */
		detail: text('detail').notNull().default('')
	},
	(t) => [index('audit_log_project_idx').on(t.projectId, t.at)]
);

export type User = typeof users.$inferSelect;
export type Project = typeof projects.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
export type ApiToken = typeof apiTokens.$inferSelect;
export type OutboxMessage = typeof outbox.$inferSelect;
export type AuditEntry = typeof auditLog.$inferSelect;
