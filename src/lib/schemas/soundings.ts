import { z } from 'zod';
import { simulatedProperty } from './stratigraphy';
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

const soundingName = z.string().trim().min(1, { error: 'Enter a name.' }).max(100, { error: 'Use at most 100 characters for a sounding name.' });

/** What to do with one sounding whose name is taken, named by its file and its name there. */
export const clashResolutionSchema = z.strictObject({
	file: z.string().max(260),
	sounding: z.string().max(1000),
	action: z.enum(['skip', 'replace', 'rename'], { error: 'Choose skip, replace or rename.' }),
	name: soundingName.optional()
});

/** Contacts from AGS4 GEOL groups: each key (GEOL_GEOL code, or description) to a unit name, or null to leave it out. */
export const geologyRequestSchema = z.strictObject({
	units: z
		.array(
			z.strictObject({
				key: z.string().max(1000),
				unit: z.string().trim().min(1, { error: 'Enter a unit name.' }).max(80, { error: 'Use at most 80 characters for the unit name.' }).nullable(),
				property: simulatedProperty.optional()
			})
		)
		.max(500)
});

/**
 * The `options` part of a soundings upload (multipart, JSON text): one mapping for every delimited file,
 * or a mapping per file name; fallbacks for GEF and AGS4 files that state no ground elevation or area ratio;
 * `dryRun` to get the plan without writing; resolutions of name clashes; contacts from GEOL groups.
 */
export const uploadOptionsSchema = z.strictObject({
	dryRun: z.boolean().optional(),
	clashes: z.array(clashResolutionSchema).max(10_000).optional(),
	geology: geologyRequestSchema.optional(),
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
