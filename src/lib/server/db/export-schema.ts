/**
 * What the Exports section keeps: uploaded meshes (element centroids as Float64 BLOBs, like soundings' readings),
 * the modeller's transfer tables and transfer sets (named, versioned, immutable once saved), and export jobs with
 * their status, progress and file.
 */
import { blob, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { now, projectRef, timestamp, users, uuidKey } from './schema';
import { recipes } from './recipe-schema';

/** An uploaded mesh: one row per element centroid would be 2 000 000 rows, so its columns are BLOBs. */
export const meshes = sqliteTable(
	'meshes',
	{
		id: uuidKey(),
		projectId: projectRef(),
		name: text('name').notNull(),
		geometry: text('geometry', { enum: ['2d', '3d'] }).notNull(),
		sourceFile: text('source_file').notNull(),
		elements: integer('elements').notNull(),
		/** Element ids, one per line (ids may be any text without a line break). */
		ids: text('ids').notNull(),
		x: blob('x', { mode: 'buffer' }).notNull(),
		/** Northings (3D); null for a 2D section. */
		y: blob('y', { mode: 'buffer' }),
		z: blob('z', { mode: 'buffer' }).notNull(),
		/** Index into `groups` of each element, as little-endian Int32 (null without a group column). */
		groupIndex: blob('group_index', { mode: 'buffer' }),
		/** The distinct groups with their element counts. */
		groups: text('groups', { mode: 'json' }).$type<{ name: string; elements: number }[]>().notNull(),
		/** Extent of the centroids: x, y (null in 2D), z. */
		bounds: text('bounds', { mode: 'json' }).$type<{ x: [number, number]; y: [number, number] | null; z: [number, number] }>().notNull(),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('meshes_project_name_idx').on(t.projectId, t.name)]
);

export const MONOTONIC = ['increasing', 'decreasing', 'none'] as const;

/** A modeller's lookup table: output = f(input property), piecewise linear. Saving a name again adds a version. */
export const transferTables = sqliteTable(
	'transfer_tables',
	{
		id: uuidKey(),
		projectId: projectRef(),
		name: text('name').notNull(),
		version: integer('version').notNull(),
		/** The simulated property it reads (a key of $lib/properties). */
		input: text('input').notNull(),
		/** The model parameter it gives: a column name and its unit. */
		output: text('output').notNull(),
		outputUnit: text('output_unit').notNull(),
		monotonic: text('monotonic', { enum: MONOTONIC }).notNull(),
		points: text('points', { mode: 'json' }).$type<[number, number][]>().notNull(),
		note: text('note').notNull().default(''),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('transfer_tables_name_version_idx').on(t.projectId, t.name, t.version)]
);

/** Which parameters each domain's property is carried to: a named, versioned list of rules. */
export const transferSets = sqliteTable(
	'transfer_sets',
	{
		id: uuidKey(),
		projectId: projectRef(),
		name: text('name').notNull(),
		version: integer('version').notNull(),
		/** The rules (TransferRule[] in $lib/schemas/exports). */
		rules: text('rules', { mode: 'json' }).$type<unknown>().notNull(),
		note: text('note').notNull().default(''),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('transfer_sets_name_version_idx').on(t.projectId, t.name, t.version)]
);

export const EXPORT_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled', 'expired'] as const;
export type ExportStatus = (typeof EXPORT_STATUSES)[number];

/** A large export run as a job: its request, where it stands, and its file under the data directory. */
export const exportJobs = sqliteTable(
	'export_jobs',
	{
		id: uuidKey(),
		projectId: projectRef(),
		recipeId: text('recipe_id').references(() => recipes.id, { onDelete: 'set null' }),
		recipeHash: text('recipe_hash').notNull(),
		/** The request as validated (exportRequestSchema in $lib/schemas/exports). */
		request: text('request', { mode: 'json' }).$type<unknown>().notNull(),
		status: text('status', { enum: EXPORT_STATUSES }).notNull().default('queued'),
		/** 0 … 1. */
		progress: real('progress').notNull().default(0),
		fileName: text('file_name').notNull(),
		bytes: integer('bytes'),
		error: text('error'),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at').notNull().default(now),
		startedAt: timestamp('started_at'),
		finishedAt: timestamp('finished_at'),
		/** When the file is deleted (retention); null until it is written. */
		expiresAt: timestamp('expires_at')
	},
	(t) => [index('export_jobs_project_idx').on(t.projectId, t.createdAt)]
);

export type MeshRow = typeof meshes.$inferSelect;
export type TransferTableRow = typeof transferTables.$inferSelect;
export type TransferSetRow = typeof transferSets.$inferSelect;
export type ExportJobRow = typeof exportJobs.$inferSelect;
