import { z } from 'zod';
import { displayName } from './common';
import { coordinate, elevation, SOUNDING_NAME_MAX } from './bounds';

const header = z.string().min(1, { error: 'Choose a column.' }).max(200);
const columnOr = (value: z.ZodType<number>) => z.union([z.strictObject({ column: header }), z.strictObject({ value })]);

/** Units a delimited file's columns may be in (the column-mapping step offers exactly these). */
export const LENGTH_UNIT_CHOICES = ['m', 'ft'] as const;
export const STRESS_UNIT_CHOICES = ['MPa', 'kPa', 'tsf'] as const;

/** The column mapping of a delimited-text file, as the cpt library's parseDelimited takes it. */
export const delimitedMappingSchema = z.strictObject({
	delimiter: z.enum([',', ';', '\t']).optional(),
	id: header.optional(),
	defaultId: displayName(SOUNDING_NAME_MAX, { required: 'Enter a sounding name.', tooLong: `Use at most ${SOUNDING_NAME_MAX} characters for a sounding name.` }).optional(),
	depth: header,
	qc: header,
	fs: header,
	u2: header.optional(),
	extra: z.array(header).max(50).optional(),
	units: z.strictObject({
		depth: z.enum(LENGTH_UNIT_CHOICES, { error: 'Depth is in m or ft.' }),
		qc: z.enum(STRESS_UNIT_CHOICES, { error: 'qc is in MPa, kPa or tsf.' }),
		fs: z.enum(STRESS_UNIT_CHOICES, { error: 'fs is in MPa, kPa or tsf.' }),
		u2: z.enum(STRESS_UNIT_CHOICES, { error: 'u2 is in MPa, kPa or tsf.' }).optional(),
		coordinates: z.enum(LENGTH_UNIT_CHOICES).optional()
	}),
	x: columnOr(coordinate('The easting')).optional(),
	y: columnOr(coordinate('The northing')).optional(),
	chainage: columnOr(coordinate('The chainage')).optional(),
	groundElevation: columnOr(elevation('The ground elevation')).optional(),
	areaRatio: z
		.union([
			z.strictObject({ column: header }),
			z.strictObject({ value: z.number().min(0, { error: 'The area ratio is within 0–1.' }).max(1, { error: 'The area ratio is within 0–1.' }) })
		])
		.optional()
});

/**
 * The `options` part of a soundings upload (multipart, JSON text): one mapping for every delimited file,
 * or a mapping per file name; fallbacks for GEF and AGS4 files that state no ground elevation or area ratio.
 */
export const uploadOptionsSchema = z.strictObject({
	mapping: delimitedMappingSchema.optional(),
	mappings: z.record(z.string().max(260), delimitedMappingSchema).optional(),
	defaults: z
		.strictObject({
			groundElevation: elevation('The ground elevation').optional(),
			areaRatio: z.number().min(0).max(1).optional()
		})
		.optional()
});

export type UploadOptions = z.output<typeof uploadOptionsSchema>;
