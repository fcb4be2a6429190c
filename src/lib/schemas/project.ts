import { z } from 'zod';
import { displayName } from './common';

export const projectName = displayName(120, { required: 'Enter a project name.', tooLong: 'Use at most 120 characters.' });

const description = z.string().trim().max(2000, { error: 'Use at most 2000 characters.' });
const lengthUnit = z.enum(['m', 'ft'], { error: 'Choose metres (m) or feet (ft).' });

export const projectCreateSchema = z.object({
	name: projectName,
	description: description.default(''),
	lengthUnit: lengthUnit.default('m')
});

/** Only the fields given change; no defaults, so a rename cannot reset the unit. */
export const projectUpdateSchema = z
	.object({ name: projectName.optional(), description: description.optional(), lengthUnit: lengthUnit.optional() })
	.refine((v) => Object.values(v).some((x) => x !== undefined), { error: 'Nothing to update.' });

export type ProjectCreate = z.infer<typeof projectCreateSchema>;
export type ProjectUpdate = z.infer<typeof projectUpdateSchema>;
