/**
 * A project's recipes: created from a setup (resolved by recipe-resolve.ts), stored immutably with the SHA-256 of
 * their canonical JSON, listed, read and deleted. The same inputs give the same hash, so creating them twice
 * returns the recipe already stored. Realizations are never stored: they are regenerated from the document.
 */
import { and, asc, desc, eq, ne } from 'drizzle-orm';
import { canonicalJson, recipeSchema, sha256, type Recipe } from '$lib/geostat';
import { getDb } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { recipeSummaries, recipes, type RecipeRow, type RecipeStatus } from '$lib/server/db/recipe-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
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

/** One recipe with the setup it was made from and its provenance (GET …/recipes/:rid). */
export interface RecipeView extends RecipeSummaryView {
	setup: RecipeSetup;
	provenance: RecipeProvenance;
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
		.select({ ...summaryColumns, setup: recipes.setup, provenance: recipes.provenance })
		.from(recipes)
		.leftJoin(users, eq(users.id, recipes.createdBy))
		.where(and(eq(recipes.id, recipeId), eq(recipes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Recipe not found.');
	return { ...summary(row), setup: row.setup as RecipeSetup, provenance: row.provenance as RecipeProvenance };
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
	return { hash, recipe: recipeSchema.parse(JSON.parse(text)), document: text };
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
	const row = db
		.insert(recipes)
		.values({
			projectId,
			name: setup.name,
			kind: recipe.kind ?? 'sgs',
			zonationId: setup.zonationId,
			hash,
			engineVersion: recipe.engineVersion,
			realizations: setup.realizations,
			document: text,
			setup,
			provenance,
			createdBy: userId
		})
		.onConflictDoNothing({ target: [recipes.projectId, recipes.hash] })
		.returning({ id: recipes.id })
		.get();
	if (!row) return { recipe: getRecipe(projectId, findByHash(db, projectId, hash)!, db), created: false };
	return { recipe: getRecipe(projectId, row.id, db), created: true };
}

/**
 * Deletes a recipe. Its cached summaries go too unless another recipe (of any project) has the same hash.
 * @throws ServiceError 404 when the recipe is not in the project
 */
export function deleteRecipe(projectId: string, recipeId: string, db: DbOrTx = getDb()): void {
	const { hash } = recipeDocument(projectId, recipeId, db);
	db.delete(recipes).where(eq(recipes.id, recipeId)).run();
	const others = db.select({ id: recipes.id }).from(recipes).where(eq(recipes.hash, hash)).get();
	if (!others) db.delete(recipeSummaries).where(eq(recipeSummaries.recipeHash, hash)).run();
}

function findByHash(db: DbOrTx, projectId: string, hash: string): string | undefined {
	return db
		.select({ id: recipes.id })
		.from(recipes)
		.where(and(eq(recipes.projectId, projectId), eq(recipes.hash, hash)))
		.get()?.id;
}
