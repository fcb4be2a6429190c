import { and, asc, count, desc, eq, max } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { domains, variogramComments, variograms, zonations, type Variogram } from '$lib/server/db/site-schema';
import { hasRole, type ProjectRole } from '$lib/server/auth/roles';
import { ServiceError } from '$lib/server/errors';
import type { VariogramSave } from '$lib/schemas/variogram';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';

/** Who may do what with saved variograms: viewers read, reviewers comment, analysts save and restore. */
export const VARIOGRAM_ROLES = { read: 'viewer', comment: 'reviewer', save: 'analyst', restore: 'analyst' } as const satisfies Record<
	string,
	ProjectRole
>;

/** The caller as the route's authorization helper resolved it. */
export interface Actor {
	userId: string;
	role: ProjectRole;
}

export interface PersonView {
	id: string;
	name: string;
}

export interface VariogramView {
	id: string;
	domainId: string;
	name: string;
	version: number;
	model: Record<string, unknown>;
	settings: Record<string, unknown>;
	misfit: number | null;
	note: string;
	createdBy: PersonView | null;
	createdAt: string;
	comments: number;
}

export interface CommentView {
	id: string;
	variogramId: string;
	body: string;
	author: PersonView | null;
	createdAt: string;
}

function allow(actor: Actor, action: keyof typeof VARIOGRAM_ROLES): void {
	const need = VARIOGRAM_ROLES[action];
	if (!hasRole(actor.role, need)) throw new ServiceError(403, `This needs the ${need} role or higher on the project.`);
}

/** The domain, when it belongs to the project; a 404 otherwise (as for a domain that does not exist). */
function checkDomain(db: DbOrTx, projectId: string, domainId: string): void {
	const row = db
		.select({ id: domains.id })
		.from(domains)
		.innerJoin(zonations, eq(zonations.id, domains.zonationId))
		.where(and(eq(domains.id, domainId), eq(zonations.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Domain not found.');
}

function person(id: string | null, name: string | null, email: string | null): PersonView | null {
	return id ? { id, name: name || email || 'Unknown' } : null;
}

function selectViews(db: DbOrTx, where: ReturnType<typeof eq>) {
	const comments = db
		.select({ variogramId: variogramComments.variogramId, n: count().as('n') })
		.from(variogramComments)
		.groupBy(variogramComments.variogramId)
		.as('c');
	return db
		.select({ v: variograms, userName: users.name, userEmail: users.email, comments: comments.n })
		.from(variograms)
		.leftJoin(users, eq(users.id, variograms.createdBy))
		.leftJoin(comments, eq(comments.variogramId, variograms.id))
		.where(where);
}

function view(r: { v: Variogram; userName: string | null; userEmail: string | null; comments: number | null }): VariogramView {
	return {
		id: r.v.id,
		domainId: r.v.domainId,
		name: r.v.name,
		version: r.v.version,
		model: r.v.model,
		settings: r.v.settings,
		misfit: r.v.misfit,
		note: r.v.note,
		createdBy: person(r.v.createdBy, r.userName, r.userEmail),
		createdAt: r.v.createdAt.toISOString(),
		comments: r.comments ?? 0
	};
}

/** Every saved version of every variogram of a domain, newest first. */
export function listVariograms(projectId: string, domainId: string, actor: Actor, db: DbOrTx = getDb()): VariogramView[] {
	allow(actor, 'read');
	checkDomain(db, projectId, domainId);
	return selectViews(db, eq(variograms.domainId, domainId))
		.orderBy(desc(variograms.createdAt), asc(variograms.name), desc(variograms.version))
		.all()
		.map(view);
}

export function getVariogram(projectId: string, domainId: string, variogramId: string, actor: Actor, db: DbOrTx = getDb()): VariogramView {
	allow(actor, 'read');
	checkDomain(db, projectId, domainId);
	const row = selectViews(db, and(eq(variograms.id, variogramId), eq(variograms.domainId, domainId)) as ReturnType<typeof eq>).get();
	if (!row) throw new ServiceError(404, 'Variogram not found.');
	return view(row);
}

/**
 * Saves a model as the next version of the named variogram of a domain (version 1 for a new name).
 * Names compare as given after trimming; the version is assigned inside the transaction, so two saves
 * under one name cannot get the same number (the unique index backs this up).
 */
export function saveVariogram(projectId: string, domainId: string, actor: Actor, input: VariogramSave, db: DbOrTx = getDb()): VariogramView {
	allow(actor, 'save');
	checkDomain(db, projectId, domainId);
	const id = insertVersion(db, domainId, actor.userId, input);
	return getVariogram(projectId, domainId, id, actor, db);
}

/** Restores an old version: its model, settings and misfit saved again as the newest version of its name. */
export function restoreVariogram(
	projectId: string,
	domainId: string,
	variogramId: string,
	actor: Actor,
	note?: string,
	db: DbOrTx = getDb()
): VariogramView {
	allow(actor, 'restore');
	const old = getVariogram(projectId, domainId, variogramId, actor, db);
	const id = insertVersion(db, domainId, actor.userId, {
		name: old.name,
		model: old.model as VariogramSave['model'],
		settings: old.settings as VariogramSave['settings'],
		misfit: old.misfit,
		note: note?.trim() || `Restored from version ${old.version}.`
	});
	return getVariogram(projectId, domainId, id, actor, db);
}

function insertVersion(db: DbOrTx, domainId: string, userId: string, input: VariogramSave): string {
	const run = (tx: DbOrTx) => {
		const last = tx
			.select({ v: max(variograms.version) })
			.from(variograms)
			.where(and(eq(variograms.domainId, domainId), eq(variograms.name, input.name)))
			.get();
		return tx
			.insert(variograms)
			.values({
				domainId,
				name: input.name,
				version: (last?.v ?? 0) + 1,
				model: input.model,
				settings: input.settings,
				misfit: input.misfit,
				note: input.note,
				createdBy: userId
			})
			.returning({ id: variograms.id })
			.get().id;
	};
	return inTransaction(db, run);
}

/** Comments on a saved variogram, oldest first. */
export function listComments(projectId: string, domainId: string, variogramId: string, actor: Actor, db: DbOrTx = getDb()): CommentView[] {
	getVariogram(projectId, domainId, variogramId, actor, db);
	return db
		.select({ c: variogramComments, userName: users.name, userEmail: users.email })
		.from(variogramComments)
		.leftJoin(users, eq(users.id, variogramComments.userId))
		.where(eq(variogramComments.variogramId, variogramId))
		.orderBy(asc(variogramComments.createdAt), asc(variogramComments.id))
		.all()
		.map((r) => ({
			id: r.c.id,
			variogramId: r.c.variogramId,
			body: r.c.body,
			author: person(r.c.userId, r.userName, r.userEmail),
			createdAt: r.c.createdAt.toISOString()
		}));
}

export function addComment(projectId: string, domainId: string, variogramId: string, actor: Actor, body: string, db: DbOrTx = getDb()): CommentView {
	allow(actor, 'comment');
	getVariogram(projectId, domainId, variogramId, actor, db);
	const row = db.insert(variogramComments).values({ variogramId, userId: actor.userId, body }).returning().get();
	return listComments(projectId, domainId, variogramId, actor, db).find((c) => c.id === row.id)!;
}
