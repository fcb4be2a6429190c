/**
 * Tables of a project's site model: source files and soundings, stratigraphy (units, contacts, zone
 * boundaries), zonations and their domains, and saved variograms. Measured columns of a sounding are
 * stored as little-endian Float64 BLOBs, one per quantity (see DEVELOPERS.md for the measurement).
 */
import { blob, index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import type { VariogramModel } from '../../geostat';
import type { ConditioningRules } from '../../site/conditioning-rules';
import { SIMULATED_PROPERTIES } from '../../properties';
import { now, projects, timestamp, users } from './schema';

const id = () =>
	text('id')
		.primaryKey()
		.$defaultFn(() => crypto.randomUUID());
const projectRef = () =>
	text('project_id')
		.notNull()
		.references(() => projects.id, { onDelete: 'cascade' });
const json = <T>(name: string) => text(name, { mode: 'json' }).$type<T>();

export const SOURCE_FORMATS = ['delimited', 'gef', 'ags4'] as const;
export type SourceFormat = (typeof SOURCE_FORMATS)[number];


export const AVERAGING = ['none', 'mean', 'median'] as const;
export type Averaging = (typeof AVERAGING)[number];

/** A project's site settings: 2D section or 3D, the section line, groundwater. One row per project. */
export const siteSettings = sqliteTable('site_settings', {
	projectId: text('project_id')
		.primaryKey()
		.references(() => projects.id, { onDelete: 'cascade' }),
	geometry: text('geometry', { enum: ['2d', '3d'] }).notNull().default('2d'),
	/** Polyline in plan, [[x, y], …], in the project's length unit; chainage runs from its first point. */
	sectionLine: json<[number, number][]>('section_line'),
	/** Soundings farther than this from the section line are flagged. */
	offLineTolerance: real('off_line_tolerance').notNull().default(25),
	groundwaterElevation: real('groundwater_elevation'),
	updatedAt: timestamp('updated_at').notNull().default(now)
});

/** Each accepted upload's original bytes, kept so a re-upload is recognised and the source can be audited. */
export const sourceFiles = sqliteTable(
	'source_files',
	{
		id: id(),
		projectId: projectRef(),
		name: text('name').notNull(),
		format: text('format', { enum: SOURCE_FORMATS }).notNull(),
		sha256: text('sha256').notNull(),
		size: integer('size').notNull(),
		bytes: blob('bytes', { mode: 'buffer' }).notNull(),
		/** The column mapping used for delimited text. */
		mapping: json<Record<string, unknown>>('mapping'),
		uploadedBy: text('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
		uploadedAt: timestamp('uploaded_at').notNull().default(now)
	},
	(t) => [uniqueIndex('source_files_project_sha_idx').on(t.projectId, t.sha256)]
);

export const soundings = sqliteTable(
	'soundings',
	{
		id: id(),
		projectId: projectRef(),
		sourceFileId: text('source_file_id').references(() => sourceFiles.id, { onDelete: 'set null' }),
		name: text('name').notNull(),
		x: real('x'),
		y: real('y'),
		/** Chainage given directly (files located by chainage only); otherwise projected from x, y. */
		chainage: real('chainage'),
		groundElevation: real('ground_elevation').notNull(),
		areaRatio: real('area_ratio').notNull().default(0.8),
		/** Overrides the project's groundwater elevation for this sounding. */
		groundwaterElevation: real('groundwater_elevation'),
		readings: integer('readings').notNull(),
		maxDepth: real('max_depth').notNull(),
		maxQc: real('max_qc').notNull(),
		/** Float64 BLOBs, m and kPa; NaN where a reading is void. */
		depth: blob('depth', { mode: 'buffer' }).notNull(),
		qc: blob('qc', { mode: 'buffer' }).notNull(),
		fs: blob('fs', { mode: 'buffer' }).notNull(),
		u2: blob('u2', { mode: 'buffer' }),
		/** Optional extra columns (e.g. a measured fines content), name → Float64 BLOB as base64. */
		extras: json<Record<string, string>>('extras'),
		/**
		 * Someone has set or removed a contact at this sounding. Until then a sounding without contacts of its own
		 * takes interpolated ones from its neighbours along chainage, and they follow the neighbours as these change.
		 */
		contactsEdited: integer('contacts_edited', { mode: 'boolean' }).notNull().default(false),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('soundings_project_name_idx').on(t.projectId, t.name)]
);

/** Stratigraphic units, stacked by `position` (0 on top). */
export const units = sqliteTable(
	'units',
	{
		id: id(),
		projectId: projectRef(),
		name: text('name').notNull(),
		colour: text('colour').notNull(),
		position: integer('position').notNull(),
		/** Unit weights above and below the water table, kN/m³. */
		gammaAbove: real('gamma_above').notNull().default(18),
		gammaBelow: real('gamma_below').notNull().default(19),
		nkt: real('nkt').notNull().default(14),
		cfc: real('cfc').notNull().default(0),
		property: text('property', { enum: SIMULATED_PROPERTIES }).notNull().default('qc1Ncs'),
		/** Names of the zones a boundary splits the unit into, west to east (by chainage). */
		zoneNames: json<string[]>('zone_names'),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('units_project_name_idx').on(t.projectId, t.name)]
);

/**
 * The elevation of a unit's top at a sounding. A unit absent from a sounding has no row; so has the top unit
 * where it starts at the ground surface (its default, see effectiveTops in $lib/site).
 */
export const contacts = sqliteTable(
	'contacts',
	{
		soundingId: text('sounding_id')
			.notNull()
			.references(() => soundings.id, { onDelete: 'cascade' }),
		unitId: text('unit_id')
			.notNull()
			.references(() => units.id, { onDelete: 'cascade' }),
		topElevation: real('top_elevation').notNull(),
		/** Interpolated from the neighbouring soundings along chainage rather than entered, picked or imported. */
		interpolated: integer('interpolated', { mode: 'boolean' }).notNull().default(false)
	},
	(t) => [primaryKey({ columns: [t.soundingId, t.unitId] }), index('contacts_unit_idx').on(t.unitId)]
);

/**
 * A lateral boundary splitting a unit into zones: a straight line in the section from
 * (chainageTop, elevationTop) to (chainageBottom, elevationBottom); vertical when the chainages agree.
 */
export const zoneBoundaries = sqliteTable('zone_boundaries', {
	id: id(),
	unitId: text('unit_id')
		.notNull()
		.references(() => units.id, { onDelete: 'cascade' }),
	chainageTop: real('chainage_top').notNull(),
	elevationTop: real('elevation_top').notNull(),
	chainageBottom: real('chainage_bottom').notNull(),
	elevationBottom: real('elevation_bottom').notNull(),
	createdAt: timestamp('created_at').notNull().default(now)
});

/** A way of grouping units and zones into simulation domains; a project holds several to compare. */
export const zonations = sqliteTable(
	'zonations',
	{
		id: id(),
		projectId: projectRef(),
		name: text('name').notNull(),
		description: text('description').notNull().default(''),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('zonations_project_name_idx').on(t.projectId, t.name)]
);

export const domains = sqliteTable(
	'domains',
	{
		id: id(),
		zonationId: text('zonation_id')
			.notNull()
			.references(() => zonations.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		position: integer('position').notNull().default(0),
		property: text('property', { enum: SIMULATED_PROPERTIES }).notNull(),
		/** Samples averaged to this cell height (m or ft), or every reading when null. */
		cellHeight: real('cell_height'),
		averaging: text('averaging', { enum: AVERAGING }).notNull().default('none'),
		/** Cell size for declustering weights; equal weights when null. */
		declusterCell: json<{ x: number; y: number; z: number }>('decluster_cell'),
		/** Which readings condition the domain (buffer at contacts, minimum depth and σ′v, soundings, flags); null: all. */
		rules: json<ConditioningRules>('rules'),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('domains_zonation_name_idx').on(t.zonationId, t.name)]
);

/** Which units (zone −1: the whole unit) or zones of a unit make up a domain. */
export const domainMembers = sqliteTable(
	'domain_members',
	{
		domainId: text('domain_id')
			.notNull()
			.references(() => domains.id, { onDelete: 'cascade' }),
		unitId: text('unit_id')
			.notNull()
			.references(() => units.id, { onDelete: 'cascade' }),
		zone: integer('zone').notNull().default(-1)
	},
	(t) => [primaryKey({ columns: [t.domainId, t.unitId, t.zone] })]
);

/** A saved variogram model of a domain; saving under an existing name adds a version. */
export const variograms = sqliteTable(
	'variograms',
	{
		id: id(),
		domainId: text('domain_id')
			.notNull()
			.references(() => domains.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		version: integer('version').notNull(),
		/** The VariogramModel, as the engine takes it. */
		model: json<VariogramModel>('model').notNull(),
		/**
		 * The experimental settings (property, transform, declustering, lags, band …) that produced the fit; read
		 * through readVariogramSettings ($lib/schemas/variogram), since older rows use older transform names.
		 */
		settings: json<unknown>('settings').notNull(),
		misfit: real('misfit'),
		note: text('note').notNull().default(''),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at').notNull().default(now)
	},
	(t) => [uniqueIndex('variograms_domain_name_version_idx').on(t.domainId, t.name, t.version)]
);

export const variogramComments = sqliteTable('variogram_comments', {
	id: id(),
	variogramId: text('variogram_id')
		.notNull()
		.references(() => variograms.id, { onDelete: 'cascade' }),
	userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
	body: text('body').notNull(),
	createdAt: timestamp('created_at').notNull().default(now)
});

export type SiteSettings = typeof siteSettings.$inferSelect;
export type SourceFile = typeof sourceFiles.$inferSelect;
export type Sounding = typeof soundings.$inferSelect;
export type Unit = typeof units.$inferSelect;
export type Contact = typeof contacts.$inferSelect;
export type ZoneBoundary = typeof zoneBoundaries.$inferSelect;
export type Zonation = typeof zonations.$inferSelect;
export type Domain = typeof domains.$inferSelect;
export type DomainMember = typeof domainMembers.$inferSelect;
export type Variogram = typeof variograms.$inferSelect;
export type VariogramComment = typeof variogramComments.$inferSelect;
