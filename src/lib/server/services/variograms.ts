import { and, asc, count, desc, eq, max, type SQL } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { domains, variogramComments, variograms, zonations, type Variogram } from '$lib/server/db/site-schema';
import { recordAudit } from './audit';
import { ServiceError } from '$lib/server/errors';
import { readVariogramSettings, type VariogramSave } from '$lib/schemas/variogram';
import type { VariogramModel } from '$lib/geostat';
import type { SavedVariogramSettings } from '$lib/variography';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';

export interface PersonView {
	id: string;
	name: string;
}

export interface VariogramView {
	id: string;
	domainId: string;
	name: string;
	version: number;
	model: VariogramModel;
	/** As saved; rows written under the old transform names read with the engine's ('none', 'normal-score'). */
	settings: SavedVariogramSettings;
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

function selectViews(db: DbOrTx, where: SQL | undefined) {
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
		settings: readVariogramSettings(r.v.settings),
		misfit: r.v.misfit,
		note: r.v.note,
		createdBy: person(r.v.createdBy, r.userName, r.userEmail),
		createdAt: r.v.createdAt.toISOString(),
		comments: r.comments ?? 0
	};
}

/** Every saved version of every variogram of a domain, newest first. */
export function listVariograms(projectId: string, domainId: string, db: DbOrTx = getDb()): VariogramView[] {
	checkDomain(db, projectId, domainId);
	return selectViews(db, eq(variograms.domainId, domainId))
		.orderBy(desc(variograms.createdAt), asc(variograms.name), desc(variograms.version))
		.all()
		.map(view);
}

export function getVariogram(projectId: string, domainId: string, variogramId: string, db: DbOrTx = getDb()): VariogramView {
	checkDomain(db, projectId, domainId);
	const row = selectViews(db, and(eq(variograms.id, variogramId), eq(variograms.domainId, domainId))).get();
	if (!row) throw new ServiceError(404, 'Variogram not found.');
	return view(row);
}

/**
 * Saves a model as the next version of the named variogram of a domain (version 1 for a new name).
 * Names compare as given after trimming; the version is assigned inside the transaction, so two saves
 * under one name cannot get the same number (the unique index backs this up).
 */
export function saveVariogram(projectId: string, domainId: string, userId: string, input: VariogramSave, db: DbOrTx = getDb()): VariogramView {
	checkDomain(db, projectId, domainId);
	const id = insertVersion(db, projectId, domainId, userId, input, 'saved');
	return getVariogram(projectId, domainId, id, db);
}

/** Restores an old version: its model, settings and misfit saved again as the newest version of its name. */
export function restoreVariogram(
	projectId: string,
	domainId: string,
	variogramId: string,
	userId: string,
	note?: string,
	db: DbOrTx = getDb()
): VariogramView {
	const old = getVariogram(projectId, domainId, variogramId, db);
	const id = insertVersion(
		db,
		projectId,
		domainId,
		userId,
		{ name: old.name, model: old.model, settings: old.settings, misfit: old.misfit, note: note?.trim() || `Restored from version ${old.version}.` },
		`restored version ${old.version} of`
	);
	return getVariogram(projectId, domainId, id, db);
}

function insertVersion(db: DbOrTx, projectId: string, domainId: string, userId: string, input: VariogramSave, action: string): string {
	const run = (tx: DbOrTx) => {
		const last = tx
			.select({ v: max(variograms.version) })
			.from(variograms)
			.where(and(eq(variograms.domainId, domainId), eq(variograms.name, input.name)))
			.get();
		const version = (last?.v ?? 0) + 1;
		const id = tx
			.insert(variograms)
			.values({
				domainId,
				name: input.name,
				version,
				model: input.model,
				settings: input.settings,
				misfit: input.misfit,
				note: input.note,
				createdBy: userId
			})
			.returning({ id: variograms.id })
			.get().id;
		const domain = tx.select({ name: domains.name }).from(domains).where(eq(domains.id, domainId)).get();
		const structures = input.model.structures.map((st) => `${st.type} ${+st.sill.toPrecision(3)}`).join(' + ');
		recordAudit(tx, { projectId, kind: 'variogram', action, subject: `${input.name} v${version} (${domain?.name ?? 'domain'})`, subjectId: id, detail: structures, userId });
		return id;
	};
	return inTransaction(db, run);
}

/** Comments on a saved variogram, oldest first. */
export function listComments(projectId: string, domainId: string, variogramId: string, db: DbOrTx = getDb()): CommentView[] {
	getVariogram(projectId, domainId, variogramId, db);
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

export function addComment(projectId: string, domainId: string, variogramId: string, userId: string, body: string, db: DbOrTx = getDb()): CommentView {
	getVariogram(projectId, domainId, variogramId, db);
	const row = db.insert(variogramComments).values({ variogramId, userId, body }).returning().get();
	return listComments(projectId, domainId, variogramId, db).find((c) => c.id === row.id)!;
}
