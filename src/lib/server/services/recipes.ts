/**
 * A project's recipes: created from a setup (resolved by recipe-resolve.ts), stored immutably with the SHA-256 of
 * their canonical JSON, listed, read and deleted; reviewed (a request e-mails the project's reviewers, comments
 * e-mail the author) and approved (the approval records the hash and freezes the recipe: it cannot be deleted).
 * The same inputs give the same hash, so creating them twice returns the recipe already stored. Realizations are
 * never stored: they are regenerated from the document. Every change is written with its audit-log entry.
 */
import { and, asc, desc, eq, isNull, ne } from 'drizzle-orm';
import { canonicalJson, parseRecipeDocument, recipeSchema, sha256, type Recipe } from '$lib/geostat';
import { getDb } from '$lib/server/db';
import { memberships, projects, users } from '$lib/server/db/schema';
import { recipeNotes, recipeSummaries, recipeWeakZones, recipes, type RecipeNoteKind, type RecipeRow, type RecipeStatus } from '$lib/server/db/recipe-schema';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';
import { actionMail, sendMail } from '$lib/server/mail';
import { recordAudit } from './audit';
import { ServiceError } from '$lib/server/errors';
import type { RecipeSetup } from '$lib/schemas/recipe';
import { resolveRecipe, type RecipeProvenance } from './recipe-resolve';
import type { PersonView } from './variograms';

export type { RecipeProvenance, ProvenanceDomain } from './recipe-resolve';

/** A recipe as the list shows it (GET …/recipes). */
export interface RecipeSummaryView {
	id: string;
	name: string;
	kind: RecipeRow['kind'];
	zonationId: string | null;
	hash: string;
	engineVersion: string;
	realizations: number;
	status: RecipeStatus;
	createdAt: string;
	createdBy: PersonView | null;
}

/** The approval of a recipe: who approved which hash, when, and what they wrote. */
export interface ApprovalView {
	by: PersonView | null;
	at: string;
	/** The recipe's hash as approved (recorded with the approval). */
	hash: string;
	comment: string;
}

/** One recipe with the setup it was made from, its provenance and its approval (GET …/recipes/:rid). */
export interface RecipeView extends RecipeSummaryView {
	setup: RecipeSetup;
	provenance: RecipeProvenance;
	approval: ApprovalView | null;
}

/** One entry of a recipe's thread: a comment, a request for review (its note) or the approval (its comment). */
export interface RecipeNoteView {
	id: string;
	kind: RecipeNoteKind;
	by: PersonView | null;
	body: string;
	createdAt: string;
}

const summaryColumns = {
	id: recipes.id,
	name: recipes.name,
	kind: recipes.kind,
	zonationId: recipes.zonationId,
	hash: recipes.hash,
	engineVersion: recipes.engineVersion,
	realizations: recipes.realizations,
	status: recipes.status,
	createdAt: recipes.createdAt,
	createdBy: recipes.createdBy,
	userName: users.name,
	userEmail: users.email
};

interface SummaryRow extends Omit<RecipeSummaryView, 'createdAt' | 'createdBy'> {
	createdAt: Date;
	createdBy: string | null;
	userName: string | null;
	userEmail: string | null;
}

function summary(r: SummaryRow): RecipeSummaryView {
	return {
		id: r.id,
		name: r.name,
		kind: r.kind,
		zonationId: r.zonationId,
		hash: r.hash,
		engineVersion: r.engineVersion,
		realizations: r.realizations,
		status: r.status,
		createdAt: r.createdAt.toISOString(),
		createdBy: r.createdBy ? { id: r.createdBy, name: r.userName || r.userEmail || 'Unknown' } : null
	};
}

/** Every recipe of the project, newest first. */
export function listRecipes(projectId: string, db: DbOrTx = getDb()): RecipeSummaryView[] {
	return db
		.select(summaryColumns)
		.from(recipes)
		.leftJoin(users, eq(users.id, recipes.createdBy))
		.where(eq(recipes.projectId, projectId))
		.orderBy(desc(recipes.createdAt), asc(recipes.name))
		.all()
		.map(summary);
}

/** @throws ServiceError 404 when the recipe is not in the project */
export function getRecipe(projectId: string, recipeId: string, db: DbOrTx = getDb()): RecipeView {
	const row = db
		.select({
			...summaryColumns,
			setup: recipes.setup,
			provenance: recipes.provenance,
			approvedBy: recipes.approvedBy,
			approvedByName: recipes.approvedByName,
			approvedAt: recipes.approvedAt,
			approvedHash: recipes.approvedHash
		})
		.from(recipes)
		.leftJoin(users, eq(users.id, recipes.createdBy))
		.where(and(eq(recipes.id, recipeId), eq(recipes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Recipe not found.');
	let approval: ApprovalView | null = null;
	if (row.approvedAt && row.approvedHash) {
		const note = db
			.select({ body: recipeNotes.body })
			.from(recipeNotes)
			.where(and(eq(recipeNotes.recipeId, recipeId), eq(recipeNotes.kind, 'approval')))
			.orderBy(desc(recipeNotes.createdAt))
			.get();
		approval = {
			by: row.approvedBy || row.approvedByName ? { id: row.approvedBy ?? '', name: row.approvedByName ?? 'Unknown' } : null,
			at: row.approvedAt.toISOString(),
			hash: row.approvedHash,
			comment: note?.body ?? ''
		};
	}
	return { ...summary(row), setup: row.setup as RecipeSetup, provenance: row.provenance as RecipeProvenance, approval };
}

/**
 * The stored canonical JSON of a recipe, byte for byte, with its hash (SHA-256 of those bytes, UTF-8).
 * @throws ServiceError 404 when the recipe is not in the project
 */
export function recipeDocument(projectId: string, recipeId: string, db: DbOrTx = getDb()): { hash: string; text: string } {
	const row = db
		.select({ hash: recipes.hash, text: recipes.document })
		.from(recipes)
		.where(and(eq(recipes.id, recipeId), eq(recipes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Recipe not found.');
	return row;
}

/** The engine's recipe of a stored recipe, parsed from its document. @throws ServiceError 404 */
export function loadRecipe(projectId: string, recipeId: string, db: DbOrTx = getDb()): { hash: string; recipe: Recipe; document: string } {
	const { hash, text } = recipeDocument(projectId, recipeId, db);
	return { hash, recipe: recipeSchema.parse(parseRecipeDocument(text)), document: text };
}

/**
 * Creates a recipe from a setup: resolves it (recipe-resolve.ts), hashes its canonical JSON and stores it with
 * the setup and provenance. When the project already has a recipe with that hash (the same inputs, seed, grid
 * and N), that one is returned and nothing is written (`created: false`); two concurrent creations of the same
 * inputs store it once.
 * @throws InvalidInput (422) for a setup that cannot be resolved; ServiceError 409 when another recipe of the
 *   project already has the name
 */
export function createRecipe(projectId: string, userId: string, setup: RecipeSetup, db: DbOrTx = getDb()): { recipe: RecipeView; created: boolean } {
	const { recipe, provenance } = resolveRecipe(projectId, setup, db);
	const text = canonicalJson(recipe);
	const hash = sha256(text);
	const existing = findByHash(db, projectId, hash);
	if (existing) return { recipe: getRecipe(projectId, existing, db), created: false };
	const clash = db
		.select({ id: recipes.id, name: recipes.name })
		.from(recipes)
		.where(and(eq(recipes.projectId, projectId), ne(recipes.hash, hash)))
		.all()
		.some((r) => r.name.toLowerCase() === setup.name.toLowerCase());
	if (clash) throw new ServiceError(409, `A recipe named ${setup.name} already exists; a changed recipe is a new one: give it a new name.`);
	const row = inTransaction(db, (tx) => {
		const inserted = tx
		.insert(recipes)
		.values({
			projectId,
			name: setup.name,
			kind: recipe.kind ?? 'sgs',
			zonationId: setup.zonationId,
			hash,
			engineVersion: recipe.engineVersion,
			realizations: recipe.realizations ?? 1,
			document: text,
			setup,
			provenance,
			createdBy: userId
		})
		.onConflictDoNothing({ target: [recipes.projectId, recipes.hash] })
		.returning({ id: recipes.id })
		.get();
		if (inserted) {
			const n = recipe.realizations ?? 1;
			const what = recipe.kind === 'uniform' ? `uniform, P${recipe.input.percentiles.join(', P')}` : `sequential Gaussian simulation, ${n} realization${n === 1 ? '' : 's'}, seed ${setup.kind === 'sgs' ? setup.seed : ''}`;
			recordAudit(tx, { projectId, kind: 'recipe', action: 'created', subject: setup.name, subjectId: inserted.id, detail: `${what}; SHA-256 ${hash}`, userId });
		}
		return inserted;
	});
	if (!row) return { recipe: getRecipe(projectId, findByHash(db, projectId, hash)!, db), created: false };
	return { recipe: getRecipe(projectId, row.id, db), created: true };
}

/**
 * Deletes a recipe, unless it is approved (frozen). Its cached summaries and weak-zone figures go too unless
 * another recipe (of any project) has the same hash.
 * @throws ServiceError 404 when the recipe is not in the project; 409 when it is approved
 */
export function deleteRecipe(projectId: string, recipeId: string, db: DbOrTx = getDb()): void {
	inTransaction(db, (tx) => {
		const view = getRecipe(projectId, recipeId, tx);
		if (view.approval) {
			throw new ServiceError(
				409,
				`${view.name} was approved by ${view.approval.by?.name ?? 'a reviewer'} on ${view.approval.at.slice(0, 10)} (SHA-256 ${view.approval.hash.slice(0, 12)}…): an approved recipe is frozen and cannot be deleted.`
			);
		}
		tx.delete(recipes).where(eq(recipes.id, recipeId)).run();
		recordAudit(tx, { projectId, kind: 'recipe', action: 'deleted', subject: view.name, subjectId: recipeId, detail: `SHA-256 ${view.hash}` });
		const others = tx.select({ id: recipes.id }).from(recipes).where(eq(recipes.hash, view.hash)).get();
		if (!others) {
			tx.delete(recipeSummaries).where(eq(recipeSummaries.recipeHash, view.hash)).run();
			tx.delete(recipeWeakZones).where(eq(recipeWeakZones.recipeHash, view.hash)).run();
		}
	});
}

/** A recipe's thread, oldest first: comments, review requests and the approval. @throws ServiceError 404 */
export function listRecipeNotes(projectId: string, recipeId: string, db: DbOrTx = getDb()): RecipeNoteView[] {
	recipeDocument(projectId, recipeId, db);
	return db
		.select({ n: recipeNotes, userName: users.name, userEmail: users.email })
		.from(recipeNotes)
		.leftJoin(users, eq(users.id, recipeNotes.userId))
		.where(eq(recipeNotes.recipeId, recipeId))
		.orderBy(asc(recipeNotes.createdAt), asc(recipeNotes.id))
		.all()
		.map(({ n, userName, userEmail }) => ({
			id: n.id,
			kind: n.kind,
			by: n.userId ? { id: n.userId, name: userName || userEmail || 'Unknown' } : null,
			body: n.body,
			createdAt: n.createdAt.toISOString()
		}));
}

/** Someone to tell, and what. */
interface Mail {
	to: string;
	subject: string;
	lines: string[];
}

/** The result of a step that tells people by e-mail: whom it reached (addresses) and whom it could not. */
export interface Notified {
	notified: string[];
	failed: string[];
}

async function deliver(mails: Mail[], url: string): Promise<Notified> {
	const out: Notified = { notified: [], failed: [] };
	for (const m of mails) {
		try {
			await sendMail(actionMail(m.to, m.subject, m.lines, { label: 'Open the recipe', url }));
			out.notified.push(m.to);
		} catch (err) {
			console.error('[recipes] mail to', m.to, 'failed:', (err as Error).message);
			out.failed.push(m.to);
		}
	}
	return out;
}

/** The page of a recipe, from the site's origin. */
export function recipeUrl(origin: string, projectId: string, recipeId: string): string {
	return `${origin}/projects/${projectId}/simulations?recipe=${encodeURIComponent(recipeId)}`;
}

/**
 * Asks the project's reviewers to review a recipe: its status becomes 'review', the request (with its note)
 * joins the thread and the audit log in one transaction, then each reviewer is e-mailed a link to it.
 * @throws ServiceError 404 when the recipe is not in the project; 409 when it is already approved
 */
export async function requestReview(
	projectId: string,
	recipeId: string,
	by: { id: string; name: string | null; email: string },
	note: string,
	origin: string,
	db: DbOrTx = getDb()
): Promise<{ recipe: RecipeView } & Notified> {
	const { view, reviewers, project } = inTransaction(db, (tx) => {
		const view = getRecipe(projectId, recipeId, tx);
		if (view.approval) throw new ServiceError(409, `${view.name} is already approved; there is nothing left to review.`);
		tx.update(recipes).set({ status: 'review' }).where(eq(recipes.id, recipeId)).run();
		tx.insert(recipeNotes).values({ recipeId, kind: 'review-request', userId: by.id, body: note }).run();
		recordAudit(tx, { projectId, kind: 'recipe', action: 'asked for review of', subject: view.name, subjectId: recipeId, detail: note, userId: by.id });
		const reviewers = tx
			.select({ email: users.email, disabled: users.disabled })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(and(eq(memberships.projectId, projectId), eq(memberships.role, 'reviewer')))
			.all()
			.filter((u) => !u.disabled && u.email !== by.email);
		const project = tx.select({ name: projects.name }).from(projects).where(eq(projects.id, projectId)).get()!;
		return { view: getRecipe(projectId, recipeId, tx), reviewers, project };
	});
	const who = by.name || by.email;
	const sent = await deliver(
		reviewers.map((r) => ({
			to: r.email,
			subject: `Review asked: ${view.name} (${project.name})`,
			lines: [
				`${who} asks you to review the recipe “${view.name}” of the project “${project.name}”.`,
				...(note ? [`Their note: ${note}`] : []),
				`SHA-256 ${view.hash}.`
			]
		})),
		recipeUrl(origin, projectId, recipeId)
	);
	return { recipe: view, ...sent };
}

/**
 * Approves a recipe: records the approver, the time and the recipe's hash with the approval comment (in the
 * thread and the audit log, one transaction); the recipe is then frozen (it cannot be deleted). Its author is
 * e-mailed. Whoever made a recipe cannot approve it (another pair of eyes is the point of review).
 * @throws ServiceError 404 when the recipe is not in the project; 403 for its author; 409 when already approved
 */
export async function approveRecipe(
	projectId: string,
	recipeId: string,
	by: { id: string; name: string | null; email: string },
	comment: string,
	origin: string,
	db: DbOrTx = getDb()
): Promise<{ recipe: RecipeView } & Notified> {
	const { view, author, project } = inTransaction(db, (tx) => {
		const before = getRecipe(projectId, recipeId, tx);
		if (before.createdBy?.id === by.id) throw new ServiceError(403, `You made ${before.name}; another reviewer must approve it.`);
		const stamped = tx
			.update(recipes)
			.set({ status: 'approved', approvedBy: by.id, approvedByName: by.name || by.email, approvedAt: new Date(), approvedHash: before.hash })
			.where(and(eq(recipes.id, recipeId), isNull(recipes.approvedAt)))
			.run();
		if (stamped.changes === 0) {
			const now = getRecipe(projectId, recipeId, tx);
			throw new ServiceError(409, `${now.name} is already approved, by ${now.approval?.by?.name ?? 'a reviewer'} on ${now.approval?.at.slice(0, 10)}.`);
		}
		tx.insert(recipeNotes).values({ recipeId, kind: 'approval', userId: by.id, body: comment }).run();
		recordAudit(tx, { projectId, kind: 'recipe', action: 'approved', subject: before.name, subjectId: recipeId, detail: `SHA-256 ${before.hash}; ${comment}`, userId: by.id });
		return { view: getRecipe(projectId, recipeId, tx), author: authorOf(tx, recipeId), project: tx.select({ name: projects.name }).from(projects).where(eq(projects.id, projectId)).get()! };
	});
	const sent = await deliver(
		author && author.email !== by.email
			? [{ to: author.email, subject: `Approved: ${view.name} (${project.name})`, lines: [`${by.name || by.email} approved your recipe “${view.name}” (SHA-256 ${view.hash}).`, `Their comment: ${comment}`] }]
			: [],
		recipeUrl(origin, projectId, recipeId)
	);
	return { recipe: view, ...sent };
}

/**
 * Adds a comment to a recipe's thread (written with its audit entry) and e-mails the recipe's author, unless the
 * author wrote it.
 * @throws ServiceError 404 when the recipe is not in the project
 */
export async function commentOnRecipe(
	projectId: string,
	recipeId: string,
	by: { id: string; name: string | null; email: string },
	body: string,
	origin: string,
	db: DbOrTx = getDb()
): Promise<{ comment: RecipeNoteView } & Notified> {
	const { id, view, author, project } = inTransaction(db, (tx) => {
		const view = getRecipe(projectId, recipeId, tx);
		const id = tx.insert(recipeNotes).values({ recipeId, kind: 'comment', userId: by.id, body }).returning({ id: recipeNotes.id }).get().id;
		recordAudit(tx, { projectId, kind: 'recipe', action: 'commented on', subject: view.name, subjectId: recipeId, detail: body.length > 200 ? `${body.slice(0, 200)}…` : body, userId: by.id });
		return { id, view, author: authorOf(tx, recipeId), project: tx.select({ name: projects.name }).from(projects).where(eq(projects.id, projectId)).get()! };
	});
	const sent = await deliver(
		author && author.id !== by.id
			? [{ to: author.email, subject: `Comment on ${view.name} (${project.name})`, lines: [`${by.name || by.email} commented on your recipe “${view.name}”:`, body] }]
			: [],
		recipeUrl(origin, projectId, recipeId)
	);
	return { comment: listRecipeNotes(projectId, recipeId, db).find((n) => n.id === id)!, ...sent };
}

/** The author of a recipe, if their account still exists and is enabled. */
function authorOf(db: DbOrTx, recipeId: string): { id: string; email: string } | null {
	const row = db
		.select({ id: users.id, email: users.email, disabled: users.disabled })
		.from(recipes)
		.innerJoin(users, eq(users.id, recipes.createdBy))
		.where(eq(recipes.id, recipeId))
		.get();
	return row && !row.disabled ? { id: row.id, email: row.email } : null;
}

function findByHash(db: DbOrTx, projectId: string, hash: string): string | undefined {
	return db
		.select({ id: recipes.id })
		.from(recipes)
		.where(and(eq(recipes.projectId, projectId), eq(recipes.hash, hash)))
		.get()?.id;
}
