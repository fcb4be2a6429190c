import { z } from 'zod';
import { PATH_ORDERS } from '../simulation/types';

// A range of null means "no variation along this axis" (Infinity in the engine), which JSON cannot hold.
// A nugget ignores its ranges (0 is usual); every other structure needs ranges > 0.
const range = z.number().nonnegative().nullable();

export const sampleSchema = z.object({
	x: z.number(),
	y: z.number(),
	z: z.number(),
	value: z.number(),
	sounding: z.string().optional()
});

export const structureSchema = z
	.object({
		type: z.enum(['nugget', 'spherical', 'exponential', 'gaussian']),
		sill: z.number().nonnegative(),
		rangeMajor: range,
		rangeMinor: range,
		rangeVertical: range
	})
	.refine((s) => s.type === 'nugget' || [s.rangeMajor, s.rangeMinor, s.rangeVertical].every((r) => r === null || r > 0), {
		message: 'ranges must be > 0'
	});

export const variogramModelSchema = z.object({
	structures: z.array(structureSchema),
	azimuth: z.number()
});

const point3 = z.object({ x: z.number(), y: z.number(), z: z.number() });

/** A linear trend of the mean (LinearTrend): the domain is simulated on residuals and the trend added back. */
export const trendSchema = z.object({ origin: point3, constant: z.number(), gradient: point3 });

/** The transform a domain is simulated under: normal scores (sequential Gaussian simulation) or the values themselves. */
export const transformSchema = z.enum(['normal-score', 'none']);

export const domainInputSchema = z
	.object({
		samples: z.array(sampleSchema),
		weights: z.array(z.number().positive()).optional(),
		model: variogramModelSchema,
		// Optional, so recipes written without a trend parse (and hash) exactly as before.
		trend: trendSchema.optional(),
		transform: transformSchema,
		mean: z.number().optional(),
		kriging: z.enum(['simple', 'ordinary']),
		zmin: z.number().optional(),
		zmax: z.number().optional(),
		search: z.object({
			maxData: z.number().int().nonnegative(),
			maxSimulated: z.number().int().nonnegative(),
			maxPerSounding: z.number().int().positive().optional(),
			radius: z.object({ major: z.number().positive(), minor: z.number().positive(), vertical: z.number().positive() }).optional(),
			path: z.enum(PATH_ORDERS).optional()
		})
	})
	.refine((d) => d.weights === undefined || d.weights.length === d.samples.length, { message: 'weights must match samples', path: ['weights'] })
	.refine((d) => d.transform === 'none' || d.samples.length > 0, { message: 'a normal-score domain needs samples', path: ['samples'] });

export const simulationInputSchema = z.object({
	seed: z.string(),
	domains: z.array(domainInputSchema)
});

const xyz = z.object({ x: z.number(), y: z.number(), z: z.number() });

/** Run-length encoded domain indices in target order: [domain, count] pairs (domain −1: not simulated). */
const domainRuns = z.array(z.tuple([z.number().int().min(-1), z.number().int().positive()]));

/** A regular grid: targets origin + (i, j, k)·spacing, x fastest, then y, then z. */
export const gridTargetsSchema = z
	.object({
		kind: z.literal('grid'),
		origin: xyz,
		spacing: z.object({ x: z.number().positive(), y: z.number().positive(), z: z.number().positive() }),
		counts: z.object({ x: z.number().int().positive(), y: z.number().int().positive(), z: z.number().int().positive() }),
		domainRuns
	})
	.refine((g) => g.domainRuns.reduce((s, r) => s + r[1], 0) === g.counts.x * g.counts.y * g.counts.z, {
		message: 'domain runs must cover the grid',
		path: ['domainRuns']
	});

const ascending = (v: number[]) => v.every((x, i) => i === 0 || x > v[i - 1]);

/**
 * A rectilinear grid: cell centres given per axis (strictly increasing lists), so cells may differ in size along
 * each axis (e.g. 0.25 m tall in a liquefiable unit and 1 m tall below it). Targets (x[i], y[j], z[k]), x fastest,
 * then y, then z, as a regular grid lists them. In 2D y is [0].
 */
export const rectilinearTargetsSchema = z
	.object({
		kind: z.literal('rectilinear'),
		x: z.array(z.number()).min(1),
		y: z.array(z.number()).min(1),
		z: z.array(z.number()).min(1),
		domainRuns
	})
	.refine((g) => ascending(g.x) && ascending(g.y) && ascending(g.z), { message: 'cell centres must increase along each axis' })
	.refine((g) => g.domainRuns.reduce((s, r) => s + r[1], 0) === g.x.length * g.y.length * g.z.length, {
		message: 'domain runs must cover the grid',
		path: ['domainRuns']
	});

/**
 * A column of point targets: an array of numbers (as JSON holds it) or, between threads, the typed array of them.
 * Checked in place rather than copied as zod's array schema would copy it: a mesh recipe's columns hold up to two
 * million numbers each, and a worker would hold a second copy of them while it prepares.
 */
function pointColumn<T extends Float64Array | Int32Array>(typed: new (n: number) => T, ok: (v: unknown) => boolean, message: string) {
	return z.custom<number[] | T>((v) => {
		if (!Array.isArray(v) && !(v instanceof typed)) return false;
		const a = v as ArrayLike<unknown>;
		for (let i = 0; i < a.length; i++) if (!ok(a[i])) return false;
		return true;
	}, message);
}
const finite = (v: unknown) => typeof v === 'number' && Number.isFinite(v);
const domainIndex = (v: unknown) => Number.isInteger(v) && (v as number) >= -1;

/** Explicit target points. */
export const pointTargetsSchema = z
	.object({
		kind: z.literal('points'),
		x: pointColumn(Float64Array, finite, 'expected an array of finite numbers'),
		y: pointColumn(Float64Array, finite, 'expected an array of finite numbers'),
		z: pointColumn(Float64Array, finite, 'expected an array of finite numbers'),
		domain: pointColumn(Int32Array, domainIndex, 'expected an array of integers >= -1')
	})
	.refine((p) => p.y.length === p.x.length && p.z.length === p.x.length && p.domain.length === p.x.length, {
		message: 'point columns must have equal lengths'
	});

export const targetDefinitionSchema = z.discriminatedUnion('kind', [gridTargetsSchema, rectilinearTargetsSchema, pointTargetsSchema]);

/**
 * How a recipe's realizations are made: sequential Gaussian simulation ('sgs'), or uniform fields ('uniform':
 * each domain takes one declustered percentile of its data in each realization; see uniformValues).
 */
export const recipeKindSchema = z.enum(['sgs', 'uniform']);

/**
 * One domain of a uniform recipe: its conditioning data (as an SGS domain holds them) with their declustering
 * weights, and the value it takes in each realization, one per percentile of the recipe.
 */
export const uniformDomainSchema = z
	.object({
		samples: z.array(sampleSchema).min(1, { message: 'a uniform domain needs samples' }),
		weights: z.array(z.number().positive()),
		values: z.array(z.number())
	})
	.refine((d) => d.weights.length === d.samples.length, { message: 'weights must match samples', path: ['weights'] });

/** The input of a uniform recipe: the percentiles (0 < p < 100), one realization each, and the domains. */
export const uniformInputSchema = z
	.object({
		percentiles: z.array(z.number().gt(0).lt(100)).min(1),
		domains: z.array(uniformDomainSchema)
	})
	.refine((u) => u.domains.every((d) => d.values.length === u.percentiles.length), { message: 'each domain needs one value a percentile', path: ['domains'] });

const recipeHead = {
	engineVersion: z.string(),
	targets: targetDefinitionSchema
};

/** A recipe of sequential Gaussian simulation; no kind means 'sgs' (recipes written before kinds existed). */
export const sgsRecipeSchema = z.object({
	...recipeHead,
	kind: z.literal('sgs').optional(),
	realizations: z.number().int().positive().optional(),
	input: simulationInputSchema
});

/** A recipe of uniform fields: N = the number of percentiles, realization r at percentile r of the list. */
export const uniformRecipeSchema = z
	.object({
		...recipeHead,
		kind: z.literal('uniform'),
		realizations: z.number().int().positive(),
		input: uniformInputSchema
	})
	.refine((r) => r.realizations === r.input.percentiles.length, { message: 'a uniform recipe has one realization a percentile', path: ['realizations'] });

/**
 * A recipe: everything a realization depends on — the resolved input, the targets' definition and the engine
 * version. Realization r of a recipe is a pure function of (recipe, r).
 *
 * An ensemble's recipe also names its `kind` and its number of `realizations` N, so its hash identifies the
 * whole ensemble (realizations 0 … N − 1). For 'sgs' both are optional and left out of the canonical JSON when
 * absent, so the hash of a recipe written without them is what it always was; no kind means 'sgs'. A 'uniform'
 * recipe always states both.
 */
export const recipeSchema = z.union([sgsRecipeSchema, uniformRecipeSchema]).refine(
	(r) => {
		const n = r.input.domains.length;
		const ds: ArrayLike<number> = r.targets.kind === 'points' ? r.targets.domain : r.targets.domainRuns.map((x) => x[0]);
		for (let i = 0; i < ds.length; i++) if (ds[i] >= n) return false;
		return true;
	},
	{ message: 'target domain out of range', path: ['targets'] }
);

export type Recipe = z.infer<typeof recipeSchema>;
export type SgsRecipe = z.infer<typeof sgsRecipeSchema>;
export type UniformRecipe = z.infer<typeof uniformRecipeSchema>;
export type UniformInput = z.infer<typeof uniformInputSchema>;
export type TargetDefinition = z.infer<typeof targetDefinitionSchema>;
export type RecipeKind = z.infer<typeof recipeKindSchema>;
