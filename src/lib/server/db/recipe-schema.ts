/**
 * Recipes and their derived results. A recipe row holds the canonical JSON of the engine's recipe (with its kind
 * and number of realizations), whose SHA-256 is `hash`, so realizations are regenerated from it and never stored;
 * the form's input (`setup`) and where everything came from (`provenance`) are kept beside it, outside the hash.
 * Summaries are derived results (ensemble maps), cached by (recipe hash, stat, threshold): they can be deleted at
 * any time and are recomputed identically.
 */
import { blob, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { now, projects, timestamp, users } from './schema';
import { zonations } from './site-schema';

/** How a recipe's realizations are made; issue 13 adds uniform fields per domain. */
export const RECIPE_KINDS = ['sgs'] as const;
export type RecipeKindColumn = (typeof RECIPE_KINDS)[number];

/** Where a recipe stands; review and approval states come later. */
export const RECIPE_STATUSES = ['ready'] as const;
export type RecipeStatus = (typeof RECIPE_STATUSES)[number];

export const recipes = sqliteTable(
	'recipes',
	{
		id: text('id')
			.primaryKey()
			.$defaultFn(() => crypto.randomUUID()),
		projectId: text('project_id')
			.notNull()
			.references(() => projects.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		kind: text('kind', { enum: RECIPE_KINDS }).notNull().default('sgs'),
		/** The zonation it was made from; kept as null if that zonation is deleted (the recipe stands on its own). */
		zonationId: text('zonation_id').references(() => zonations.id, { onDelete: 'set null' }),
		/** SHA-256 of `document`, 64 hex digits; one recipe per hash in a project. */
		hash: text('hash').notNull(),
		engineVersion: text('engine_version').notNull(),
		realizations: integer('realizations').notNull(),
		status: text('status', { enum: RECIPE_STATUSES }).notNull().default('ready'),
		/** The recipe's canonical JSON (keys sorted, no whitespace), served byte for byte as recipe.json. */
		document: text('document').notNull(),
		/** The setup as the form (or API client) sent it. */
		setup: text('setup', { mode: 'json' }).$type<unknown>().notNull(),
		/** Zonation, domains, variogram versions, data rules, grid and cell counts: what the recipe was resolved from. */
		provenance: text('provenance', { mode: 'json' }).$type<unknown>().notNull(),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('recipes_project_hash_idx').on(t.projectId, t.hash)]
);

/** Ensemble maps of a recipe, one Float64 BLOB each (NaN where a target is not simulated). */
export const recipeSummaries = sqliteTable(
	'recipe_summaries',
	{
		recipeHash: text('recipe_hash').notNull(),
		stat: text('stat').notNull(),
		/** The threshold of 'below' in shortest round-trip form; '' for the other stats. */
		threshold: text('threshold').notNull().default(''),
		realizations: integer('realizations').notNull(),
		values: blob('values', { mode: 'buffer' }).notNull(),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [primaryKey({ columns: [t.recipeHash, t.stat, t.threshold] })]
);

export type RecipeRow = typeof recipes.$inferSelect;
export type RecipeSummaryRow = typeof recipeSummaries.$inferSelect;
