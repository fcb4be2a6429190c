import { z } from 'zod';

export const projectName = z
	.string({ error: 'Enter a project name.' })
	.trim()
	.min(1, { error: 'Enter a project name.' })
	.max(120, { error: 'Use at most 120 characters.' });

export const projectCreateSchema = z.object({
	name: projectName,
	description: z.string().trim().max(2000, { error: 'Use at most 2000 characters.' }).default(''),
	lengthUnit: z.enum(['m', 'ft'], { error: 'Choose metres (m) or feet (ft).' }).default('m')
});

export const projectUpdateSchema = projectCreateSchema
	.partial()
	.refine((v) => Object.values(v).some((x) => x !== undefined), { error: 'Nothing to update.' });

export type ProjectCreate = z.infer<typeof projectCreateSchema>;
export type ProjectUpdate = z.infer<typeof projectUpdateSchema>;
