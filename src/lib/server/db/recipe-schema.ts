/**
 * Recipes and their derived results. A recipe row holds the canonical JSON of the engine's recipe (with its kind
 * and number of realizations), whose SHA-256 is `hash`, so realizations are regenerated from it and never stored;
 * the form's input (`setup`) and where everything came from (`provenance`) are kept beside it, outside the hash.
 * Summaries (ensemble maps) and weak-zone figures are derived results, cached by the recipe's hash and their
 * query: they can be deleted at any time and are recomputed identically. A recipe's thread (comments, review
 * requests, the approval) is kept beside it.
 */
import { blob, index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { now, projectRef, timestamp, users, uuidKey } from './schema';
import { zonations } from './site-schema';

/** How a recipe's realizations are made: sequential Gaussian simulation, or uniform fields per domain. */
export const RECIPE_KINDS = ['sgs', 'uniform'] as const;
export type RecipeKindColumn = (typeof RECIPE_KINDS)[number];

/**
 * Where a recipe stands in review: ready (made), review (an analyst asked the project's reviewers to look at it),
 * approved (a reviewer approved it: frozen, its hash recorded, it cannot be deleted).
 */
export const RECIPE_STATUSES = ['ready', 'review', 'approved'] as const;
export type RecipeStatus = (typeof RECIPE_STATUSES)[number];

export const recipes = sqliteTable(
	'recipes',
	{
		id: uuidKey(),
		projectId: projectRef(),
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
		createdAt: timestamp('created_at').notNull().default(now),
		/** The approval: who, when, and the hash approved (the recipe's own, recorded with the approval). */
		approvedBy: text('approved_by').references(() => users.id, { onDelete: 'set null' }),
		approvedByName: text('approved_by_name'),
		approvedAt: timestamp('approved_at'),
		approvedHash: text('approved_hash')
	},
	(t) => [uniqueIndex('recipes_project_hash_idx').on(t.projectId, t.hash)]
);

/** What a recipe's thread holds: comments, requests for review (with their note) and the approval (with its comment). */
export const RECIPE_NOTE_KINDS = ['comment', 'review-request', 'approval'] as const;
export type RecipeNoteKind = (typeof RECIPE_NOTE_KINDS)[number];

/** A recipe's thread, oldest first: comments, review requests and the approval. */
export const recipeNotes = sqliteTable(
	'recipe_notes',
	{
		id: uuidKey(),
		recipeId: text('recipe_id')
			.notNull()
			.references(() => recipes.id, { onDelete: 'cascade' }),
		kind: text('kind', { enum: RECIPE_NOTE_KINDS }).notNull(),
		userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
		body: text('body').notNull().default(''),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [index('recipe_notes_recipe_idx').on(t.recipeId, t.createdAt)]
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

/**
 * Weak-zone continuity of a recipe (GET …/weak-zones), cached like the summaries by (hash, property, threshold,
 * minimum length, boundary line): a derived result, safe to delete. `boundary` is the line's four numbers in
 * shortest round-trip form ('' without a boundary), so moving a boundary is a new entry, not a stale one.
 */
export const recipeWeakZones = sqliteTable(
	'recipe_weak_zones',
	{
		recipeHash: text('recipe_hash').notNull(),
		property: text('property').notNull(),
		threshold: text('threshold').notNull(),
		minLength: text('min_length').notNull(),
		boundary: text('boundary').notNull().default(''),
		/** The figures (per realization and across them), as JSON. */
		figures: text('figures', { mode: 'json' }).$type<unknown>().notNull(),
		/** The probability map, one Float64 a target (NaN where the property is not simulated). */
		map: blob('map', { mode: 'buffer' }).notNull(),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [primaryKey({ columns: [t.recipeHash, t.property, t.threshold, t.minLength, t.boundary] })]
);

export type RecipeRow = typeof recipes.$inferSelect;
export type RecipeNoteRow = typeof recipeNotes.$inferSelect;
export type RecipeSummaryRow = typeof recipeSummaries.$inferSelect;
