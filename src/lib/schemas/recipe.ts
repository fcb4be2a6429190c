/** Request bodies and queries of the recipe endpoints: the setup a recipe is resolved from, and summary queries. */
import { z } from 'zod';
import { ENSEMBLE_STATS } from '$lib/ensemble';
import { PATH_ORDERS } from '$lib/geostat';
import { simulatedProperty } from './stratigraphy';

const finite = (label: string) => z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, { error: `${label} must be finite.` });
const positive = (label: string) => finite(label).refine((v) => v > 0, { error: `${label} must be greater than 0.` });
const count = (label: string, min: number, max: number) =>
	z
		.number({ error: `${label} must be a number.` })
		.int({ error: `${label} must be a whole number.` })
		.min(min, { error: `${label} must be at least ${min}.` })
		.max(max, { error: `${label} must be at most ${max}.` });

/** Search defaults the form states: enough neighbours for a stable kriging system at a few tens of µs each. */
export const DEFAULT_SEARCH = { maxData: 16, maxSimulated: 16, maxPerSounding: 8 } as const;
/** Most realizations of one recipe. */
export const MAX_REALIZATIONS = 500;
/** Most cells of a recipe's grid, and most values (realizations × simulated cells) a summary holds at once. */
export const MAX_CELLS = 1_000_000;
export const MAX_ENSEMBLE_VALUES = 16_000_000;

const axis = (label: string) =>
	z
		.object({ from: finite(`The ${label} start`), to: finite(`The ${label} end`), cell: positive(`The ${label} cell size`) })
		.refine((a) => a.to > a.from, { error: `The ${label} end must be above its start.`, path: ['to'] });

/** Most elements of an uploaded mesh a recipe targets. */
export const MAX_MESH_ELEMENTS = 2_000_000;

/**
 * Variable cell heights along the elevation axis: per unit (e.g. 0.25 m in a liquefiable unit, 1 m in the dense
 * deposits below; each unit's band runs over the elevations it occupies along the grid), or as elevation bands.
 * Elsewhere the axis's own `cell` applies; where bands overlap the finer height wins (elevationCells in $lib/site).
 */
export const cellHeightsSchema = z.union([
	z
		.object({
			byUnit: z
				.array(z.object({ unitId: z.string().min(1), cell: positive('A unit’s cell height') }).strict())
				.min(1, { error: 'Give at least one unit a cell height.' })
				.max(50)
		})
		.strict(),
	z
		.object({
			bands: z
				.array(
					z
						.object({ from: finite('A band’s bottom'), to: finite('A band’s top'), cell: positive('A band’s cell height') })
						.strict()
						.refine((b) => b.to > b.from, { error: 'A band’s top must be above its bottom.', path: ['to'] })
				)
				.min(1, { error: 'Give at least one band.' })
				.max(100)
		})
		.strict()
]);

const elevationAxis = z
	.object({ from: finite('The elevation start'), to: finite('The elevation end'), cell: positive('The elevation cell size'), heights: cellHeightsSchema.optional() })
	.refine((a) => a.to > a.from, { error: 'The elevation end must be above its start.', path: ['to'] });

/**
 * The target grid: chainage × elevation in 2D, a plan grid × elevation in 3D (project length unit). Without
 * `elevation.heights` it is the engine's regular grid; with them a rectilinear grid of variable cell heights.
 */
export const gridSpecSchema = z.discriminatedUnion('geometry', [
	z.object({ geometry: z.literal('2d'), chainage: axis('chainage'), elevation: elevationAxis }),
	z.object({ geometry: z.literal('3d'), x: axis('easting'), y: axis('northing'), elevation: elevationAxis })
]);

/**
 * An uploaded mesh as the targets: each element's domain read from the stratigraphy at its centroid, or from its
 * group (each group mapped to a domain of the zonation, or null: not simulated).
 */
export const meshTargetSchema = z.union([
	z.object({ meshId: z.string().min(1), assign: z.literal('stratigraphy') }).strict(),
	z
		.object({
			meshId: z.string().min(1),
			assign: z.literal('groups'),
			groups: z
				.array(z.object({ group: z.string().min(1), domainId: z.string().min(1).nullable() }).strict())
				.min(1, { error: 'Map the mesh’s groups to domains.' })
				.max(1000)
		})
		.strict()
]);

const searchSchema = z.object({
	maxData: count('Max data', 1, 64).default(DEFAULT_SEARCH.maxData),
	maxSimulated: count('Max simulated nodes', 0, 64).default(DEFAULT_SEARCH.maxSimulated),
	/** Null: no limit per sounding. */
	maxPerSounding: count('Max per sounding', 1, 64).nullable().default(DEFAULT_SEARCH.maxPerSounding),
	/**
	 * The order nodes are visited in: random, or coarse grids first (multiple-grid path; long ranges with a small
	 * search); drawn for each realization, or ('…-constant') once for all of them (see SearchOptions.path).
	 */
	path: z.enum(PATH_ORDERS, { error: `Choose a path: ${PATH_ORDERS.join(', ')}.` }).default('random'),
	/** Semi-axes of the search ellipsoid; null: the model's ranges. */
	radius: z
		.object({ major: positive('The major radius'), minor: positive('The minor radius'), vertical: positive('The vertical radius') })
		.nullable()
		.default(null)
});

const tailsSchema = z.object({
	/** Lower and upper tail bounds of the back-transform; null: the smallest and largest datum. */
	zmin: finite('The lower tail bound').nullable().default(null),
	zmax: finite('The upper tail bound').nullable().default(null)
});

/** One domain of the zonation: simulated with a saved variogram and settings, or not simulated. */
export const domainSetupSchema = z.discriminatedUnion('simulate', [
	z.object({ domainId: z.string().min(1), simulate: z.literal(false) }).strict(),
	z
		.object({
			domainId: z.string().min(1),
			simulate: z.literal(true),
			/** A saved variogram version of the domain; null: the newest saved. */
			variogramId: z.string().min(1).nullable().default(null),
			/** Simple kriging with the mean of the kriged variable (0 for normal scores), or ordinary kriging. */
			kriging: z.enum(['simple', 'ordinary'], { error: 'Choose simple or ordinary kriging.' }).default('simple'),
			search: searchSchema.prefault({}),
			tails: tailsSchema.prefault({})
		})
		.strict()
		.refine((d) => d.tails.zmin === null || d.tails.zmax === null || d.tails.zmin < d.tails.zmax, {
			error: 'The lower tail bound must be below the upper one.',
			path: ['tails', 'zmax']
		})
]);

const recipeName = z
	.string({ error: 'Give the recipe a name.' })
	.trim()
	.min(1, { error: 'Give the recipe a name.' })
	.max(80, { error: 'Use at most 80 characters.' });
const zonationId = z.string({ error: 'Choose a zonation.' }).min(1, { error: 'Choose a zonation.' });

/** The setup of a recipe of sequential Gaussian simulation (no kind given means this one). */
export const sgsSetupSchema = z
	.object({
		kind: z.literal('sgs').default('sgs'),
		name: recipeName,
		zonationId,
		seed: z
			.string({ error: 'Enter a seed.' })
			.trim()
			.min(1, { error: 'Enter a seed.' })
			.max(64, { error: 'Use at most 64 characters for the seed.' }),
		realizations: count('The number of realizations', 1, MAX_REALIZATIONS),
		/** The targets: a grid over the site, or an uploaded mesh (exactly one of the two). */
		grid: gridSpecSchema.optional(),
		mesh: meshTargetSchema.optional(),
		domains: z.array(domainSetupSchema).min(1, { error: 'Set up at least one domain.' }).max(200)
	})
	.strict()
	.refine((s) => (s.grid === undefined) !== (s.mesh === undefined), { error: 'Give either a grid or a mesh as the targets.', path: ['grid'] });

/** Most percentiles of a uniform recipe (its realizations). */
export const MAX_PERCENTILES = 50;
/** The percentiles of a uniform baseline unless others are asked for: the median. */
export const DEFAULT_PERCENTILES = [50];

const percentile = finite('A percentile').refine((p) => p > 0 && p < 100, { error: 'A percentile lies between 0 and 100 (exclusive).' });

/** The setup of a uniform recipe: each domain at a declustered percentile of its data, one realization a percentile. */
export const uniformSetupSchema = z
	.object({
		kind: z.literal('uniform'),
		name: recipeName,
		zonationId,
		/** Realization r takes percentile r of this list (P50 alone by default; e.g. 33, 50, 67 for a sensitivity study). */
		percentiles: z
			.array(percentile)
			.min(1, { error: 'Give at least one percentile.' })
			.max(MAX_PERCENTILES, { error: `Use at most ${MAX_PERCENTILES} percentiles.` })
			.refine((ps) => new Set(ps).size === ps.length, { error: 'Give each percentile once.' })
			.default(DEFAULT_PERCENTILES),
		/** The targets, as for sequential Gaussian simulation: a grid over the site, or an uploaded mesh. */
		grid: gridSpecSchema.optional(),
		mesh: meshTargetSchema.optional(),
		domains: z
			.array(z.object({ domainId: z.string().min(1), simulate: z.boolean() }).strict())
			.min(1, { error: 'Set up at least one domain.' })
			.max(200)
	})
	.strict()
	.refine((s) => (s.grid === undefined) !== (s.mesh === undefined), { error: 'Give either a grid or a mesh as the targets.', path: ['grid'] });

/** A recipe's setup, by kind: sequential Gaussian simulation (the default) or uniform fields. */
export const recipeSetupSchema = z.discriminatedUnion('kind', [sgsSetupSchema, uniformSetupSchema], { error: 'The kind is sgs or uniform.' });

export type RecipeSetup = z.output<typeof recipeSetupSchema>;
export type RecipeSetupInput = z.input<typeof recipeSetupSchema>;
export type SgsSetup = z.output<typeof sgsSetupSchema>;
export type UniformSetup = z.output<typeof uniformSetupSchema>;
export type DomainSetup = z.output<typeof domainSetupSchema>;
export type SimulatedDomainSetup = Extract<DomainSetup, { simulate: true }>;
export type GridSetup = z.output<typeof gridSpecSchema>;
export type MeshTargetSetup = z.output<typeof meshTargetSchema>;

/** An optional threshold in a query string: null when absent or blank, else a finite number. */
export const thresholdParam = z
	.string()
	.optional()
	.transform((t, ctx) => {
		if (t === undefined || t.trim() === '') return null;
		const v = Number(t);
		if (!Number.isFinite(v)) {
			ctx.addIssue({ code: 'custom', message: 'The threshold must be a number.' });
			return z.NEVER;
		}
		return v;
	});

/** GET …/summary?stat=…&threshold=…: the threshold is needed (and only read) for 'below'. */
export const summaryQuerySchema = z
	.object({
		stat: z.enum(ENSEMBLE_STATS, { error: `Choose a stat: ${ENSEMBLE_STATS.join(', ')}.` }),
		threshold: thresholdParam
	})
	.refine((q) => q.stat !== 'below' || q.threshold !== null, { error: 'P(below) needs a threshold.', path: ['threshold'] })
	.transform((q) => ({ stat: q.stat, threshold: q.stat === 'below' ? q.threshold : null }));

const numberParam = (label: string) =>
	z
		.string({ error: `Give ${label}.` })
		.trim()
		.min(1, { error: `Give ${label}.` })
		.transform((t, ctx) => {
			const v = Number(t);
			if (!Number.isFinite(v)) {
				ctx.addIssue({ code: 'custom', message: `${label[0].toUpperCase()}${label.slice(1)} must be a number.` });
				return z.NEVER;
			}
			return v;
		});

/**
 * GET …/weak-zones?property=…&threshold=…&minLength=…&boundary=…: a simulated property, the threshold below which a
 * cell is weak (in the property's unit), the least horizontal extent of the zones the probability map counts
 * (project length unit, default 0), and a zone boundary's id (optional).
 */
export const weakZonesQuerySchema = z.object({
	property: simulatedProperty,
	threshold: numberParam('a threshold'),
	minLength: z
		.string()
		.optional()
		.transform((t, ctx) => {
			if (t === undefined || t.trim() === '') return 0;
			const v = Number(t);
			if (!Number.isFinite(v) || v < 0) {
				ctx.addIssue({ code: 'custom', message: 'The least length must be a number ≥ 0.' });
				return z.NEVER;
			}
			return v;
		}),
	boundary: z
		.string()
		.optional()
		.transform((b) => (b === undefined || b.trim() === '' ? null : b.trim()))
});
export type WeakZonesQuery = z.output<typeof weakZonesQuerySchema>;

/** POST …/review: an optional note to the reviewers. */
export const reviewRequestSchema = z
	.object({ note: z.string({ error: 'The note is text.' }).trim().max(4000, { error: 'Use at most 4000 characters.' }).default('') })
	.strict();

/** POST …/approval: the reviewer's comment, required (what was checked, on what basis). */
export const approvalSchema = z
	.object({
		comment: z.string({ error: 'Say what you checked.' }).trim().min(1, { error: 'Say what you checked.' }).max(4000, { error: 'Use at most 4000 characters.' })
	})
	.strict();

/** POST …/comments on a recipe. */
export const recipeCommentSchema = z
	.object({ body: z.string({ error: 'Write a comment.' }).trim().min(1, { error: 'Write a comment.' }).max(4000, { error: 'Use at most 4000 characters.' }) })
	.strict();
