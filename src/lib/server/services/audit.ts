/**
 * The project's audit log: who did what and when. Every service that changes a project's data calls
 * recordAudit inside the transaction of the change, so the entry and the change are written together or not at
 * all. The person is the one the request acts for (asActor, set once per request in hooks.server.ts), unless
 * the entry names one.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import { and, desc, eq, lt, type SQL } from 'drizzle-orm';
import { AUDIT_KIND_LABELS, type AuditKind } from '$lib/audit';
import { csvLine } from '$lib/csv';
import { getDb } from '$lib/server/db';
import { auditLog, users } from '$lib/server/db/schema';
import type { DbOrTx } from '$lib/server/db/transaction';

/** One change to record. */
export interface AuditInput {
	projectId: string;
	kind: AuditKind;
	/** A past-tense verb: uploaded, deleted, created, changed, approved … */
	action: string;
	/** What it was done to, by name. */
	subject: string;
	subjectId?: string | null;
	/** Particulars in words. */
	detail?: string;
	/** Who did it; default the person the request acts for (asActor). */
	userId?: string | null;
}

/** An entry as the log shows it. */
export interface AuditEntryView {
	id: number;
	at: string;
	user: { id: string | null; name: string } | null;
	kind: AuditKind;
	action: string;
	subject: string;
	subjectId: string | null;
	detail: string;
}

const actor = new AsyncLocalStorage<{ userId: string | null }>();

/** Runs `fn` with `userId` as the person the audit log names for the changes made inside it. */
export function asActor<T>(userId: string | null, fn: () => T): T {
	return actor.run({ userId }, fn);
}

/**
 * Records a change in the project's audit log, with the person's name as it is now. Call it with the
 * transaction that makes the change, so a change that fails (and is rolled back) leaves no entry.
 */
export function recordAudit(tx: DbOrTx, entry: AuditInput): void {
	const userId = entry.userId ?? actor.getStore()?.userId ?? null;
	const person = userId ? tx.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, userId)).get() : undefined;
	tx.insert(auditLog)
		.values({
			projectId: entry.projectId,
			userId: person ? userId : null,
			userName: person ? person.name || person.email : null,
			kind: entry.kind,
			action: entry.action,
			subject: entry.subject,
			subjectId: entry.subjectId ?? null,
			detail: entry.detail ?? ''
		})
		.run();
}

/**
 * Records that someone downloaded an export of a recipe (kind 'export', action 'downloaded'): the file's name and
 * the recipe's hash. The download routes call it once the request has passed its checks, as the file starts to
 * stream; a download changes nothing, so there is no change's transaction for it to join.
 */
export function recordExportDownload(
	entry: { projectId: string; recipe: { id: string | null; name: string | null; hash: string }; file: string; userId: string },
	db: DbOrTx = getDb()
): void {
	recordAudit(db, {
		projectId: entry.projectId,
		kind: 'export',
		action: 'downloaded',
		subject: entry.recipe.name ?? 'a deleted recipe',
		subjectId: entry.recipe.id,
		detail: `${entry.file}; SHA-256 ${entry.recipe.hash}`,
		userId: entry.userId
	});
}

/** Filters of the log: a kind, a person, and paging back in time. */
export interface AuditQuery {
	kind?: AuditKind | null;
	userId?: string | null;
	/** Entries before this id (the next page); default the newest. */
	before?: number | null;
	/** Most entries; default 200. */
	limit?: number;
}

/** The project's log, newest first, filtered by kind and person. */
export function listAudit(projectId: string, query: AuditQuery = {}, db: DbOrTx = getDb()): AuditEntryView[] {
	const where: SQL[] = [eq(auditLog.projectId, projectId)];
	if (query.kind) where.push(eq(auditLog.kind, query.kind));
	if (query.userId) where.push(eq(auditLog.userId, query.userId));
	if (query.before) where.push(lt(auditLog.id, query.before));
	return db
		.select()
		.from(auditLog)
		.where(and(...where))
		.orderBy(desc(auditLog.id))
		.limit(query.limit ?? 200)
		.all()
		.map((r) => ({
			id: r.id,
			at: r.at.toISOString(),
			user: r.userId || r.userName ? { id: r.userId, name: r.userName ?? 'Unknown' } : null,
			kind: r.kind,
			action: r.action,
			subject: r.subject,
			subjectId: r.subjectId,
			detail: r.detail
		}));
}

/** The people who appear in a project's log, for the filter (id and name), by name. */
export function auditPeople(projectId: string, db: DbOrTx = getDb()): { id: string; name: string }[] {
	const rows = db.selectDistinct({ id: auditLog.userId, name: auditLog.userName }).from(auditLog).where(eq(auditLog.projectId, projectId)).all();
	const byId = new Map<string, string>();
	for (const r of rows) if (r.id) byId.set(r.id, r.name ?? 'Unknown');
	return [...byId].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name));
}

/**
 * The log as CSV lines (RFC 4180), newest first, with the same filters (every entry, not a page): time (ISO 8601,
 * UTC), person, kind, action, subject, detail. Text that a spreadsheet would take for a formula (starting with
 * =, +, − or @) is prefixed with an apostrophe, since names and details are typed by users.
 */
export function* auditCsv(projectId: string, query: Omit<AuditQuery, 'before' | 'limit'> = {}, db: DbOrTx = getDb()): Generator<string> {
	const rows = listAudit(projectId, { ...query, limit: Number.MAX_SAFE_INTEGER }, db);
	yield csvLine(['time (UTC)', 'person', 'kind', 'action', 'subject', 'detail']) + '\r\n';
	for (const r of rows) yield csvLine([r.at, text(r.user?.name ?? ''), AUDIT_KIND_LABELS[r.kind], r.action, text(r.subject), text(r.detail)]) + '\r\n';
}

function text(s: string): string {
	return /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
}
