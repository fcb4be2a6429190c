import { z } from 'zod';
import { transformSchema, variogramModelSchema as engineModelSchema, type VariogramModel } from '$lib/geostat';
import { SIMULATED_PROPERTIES } from '$lib/properties';
import type { SavedVariogramSettings } from '$lib/variography';
import { displayName } from './common';

const finite = z.number().refine(Number.isFinite, { error: 'Must be a finite number.' });
const positive = finite.refine((v) => v > 0, { error: 'Must be greater than 0.' });
const nonNegative = finite.refine((v) => v >= 0, { error: 'Must not be negative.' });

type EngineModel = z.output<typeof engineModelSchema>;

/**
 * A model the workspace saves: the engine's VariogramModel schema (structure types, sills ≥ 0, ranges > 0 for
 * every structure but the nugget) with the workspace's own limits on top — one to four structures, a total sill
 * above 0, and a number for every range (a recipe may write an unbounded range as null; a saved model may not).
 */
export const variogramModelSchema = engineModelSchema
	.refine((m) => m.structures.length >= 1 && m.structures.length <= 4, { error: 'A model has one to four structures.' })
	.refine((m) => m.structures.every((s) => s.rangeMajor !== null && s.rangeMinor !== null && s.rangeVertical !== null), {
		error: 'Every range must be a number.'
	})
	.refine((m) => m.structures.reduce((a, s) => a + s.sill, 0) > 0, { error: 'The total sill must be greater than 0.' })
	.transform(engineModel);

// The refinement above leaves no null range, so the model is the engine's VariogramModel as it stands.
function engineModel(m: EngineModel): VariogramModel {
	return m as VariogramModel;
}

const lagSchema = z.object({
	lag: positive,
	nLags: z.number().int().min(1).max(200),
	lagTolerance: positive
});

/** The settings saved beside a fitted model (SavedVariogramSettings in src/lib/variography). */
export const variogramSettingsSchema = z.object({
	transform: transformSchema,
	declustered: z.boolean(),
	/** Versions saved before trends existed analysed the values themselves. */
	trend: z.enum(['none', 'elevation', 'elevation-plan']).default('none'),
	vertical: lagSchema,
	horizontal: lagSchema.extend({
		verticalBand: nonNegative,
		azimuth: finite.nullable(),
		angleTolerance: finite.refine((v) => v > 0 && v <= 90, { error: 'Angle tolerance must be in (0, 90] degrees.' })
	}),
	minPairs: z.number().int().min(0),
	/** How the automatic fit was asked for, when it was used. */
	fit: z
		.object({
			type: z.enum(['spherical', 'exponential', 'gaussian']),
			nugget: z.union([z.literal('fit'), z.literal('none'), nonNegative]),
			/** Absent in versions saved before the sill could be held: those were fitted freely. */
			sill: z.enum(['variance', 'fit']).optional()
		})
		.optional(),
	/** Context of the data the fit was made on. */
	property: z.enum(SIMULATED_PROPERTIES).optional(),
	samples: z.number().int().min(0).optional()
}) satisfies z.ZodType<SavedVariogramSettings>;

/** Transform names stored before the engine's were used throughout ('raw', 'normal'), and what they mean now. */
const LEGACY_TRANSFORMS: Record<string, SavedVariogramSettings['transform']> = { raw: 'none', normal: 'normal-score' };

/**
 * Saved settings as the workspace reads them: rows written under the old transform names ('raw', 'normal')
 * get the engine's names ('none', 'normal-score'); everything else is checked against the current schema.
 * @throws {z.ZodError} for a stored object the schema does not accept
 */
export function readVariogramSettings(stored: unknown): SavedVariogramSettings {
	const s = stored as { transform?: unknown } | null;
	const legacy = s && typeof s.transform === 'string' ? LEGACY_TRANSFORMS[s.transform] : undefined;
	return variogramSettingsSchema.parse(legacy ? { ...s, transform: legacy } : stored);
}

export const variogramName = displayName(80, { required: 'Give the variogram a name.', tooLong: 'Use at most 80 characters.' });

export const variogramSaveSchema = z.object({
	name: variogramName,
	model: variogramModelSchema,
	settings: variogramSettingsSchema,
	misfit: nonNegative.nullable().default(null),
	note: z.string().trim().max(2000).default('')
});
export type VariogramSave = z.output<typeof variogramSaveSchema>;

export const variogramCommentSchema = z.object({
	body: z.string({ error: 'Write a comment.' }).trim().min(1, { error: 'Write a comment.' }).max(4000, { error: 'Use at most 4000 characters.' })
});

export const variogramRestoreSchema = z.object({ note: z.string().trim().max(2000).optional() });
