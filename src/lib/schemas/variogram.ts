import { z } from 'zod';
import { displayName } from './common';

const finite = z.number().refine(Number.isFinite, { error: 'Must be a finite number.' });
const positive = finite.refine((v) => v > 0, { error: 'Must be greater than 0.' });
const nonNegative = finite.refine((v) => v >= 0, { error: 'Must not be negative.' });

/** One nested structure of an engine VariogramModel (practical ranges; a nugget's ranges are ignored). */
export const structureSchema = z
	.object({
		type: z.enum(['nugget', 'spherical', 'exponential', 'gaussian'], { error: 'Choose nugget, spherical, exponential or gaussian.' }),
		sill: nonNegative,
		rangeMajor: nonNegative,
		rangeMinor: nonNegative,
		rangeVertical: nonNegative
	})
	.refine((s) => s.type === 'nugget' || (s.rangeMajor > 0 && s.rangeMinor > 0 && s.rangeVertical > 0), {
		error: 'Ranges of a structure must be greater than 0.'
	});

export const variogramModelSchema = z
	.object({
		structures: z.array(structureSchema).min(1, { error: 'A model needs at least one structure.' }).max(4),
		azimuth: finite
	})
	.refine((m) => m.structures.reduce((a, s) => a + s.sill, 0) > 0, { error: 'The total sill must be greater than 0.' });

const lagSchema = z.object({
	lag: positive,
	nLags: z.number().int().min(1).max(200),
	lagTolerance: positive
});

/** The experimental settings that produced a fit (see VariogramSettings in src/lib/variography). */
export const variogramSettingsSchema = z.object({
	transform: z.enum(['raw', 'normal']),
	declustered: z.boolean(),
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
			nugget: z.union([z.literal('fit'), z.literal('none'), nonNegative])
		})
		.optional(),
	/** Context of the data the fit was made on. */
	property: z.string().max(40).optional(),
	samples: z.number().int().min(0).optional()
});

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
