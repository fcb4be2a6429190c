import { z } from 'zod';
import { email, projectRole } from './common';

export const inviteSchema = z.object({ email, role: projectRole });

export const memberRoleSchema = z.object({
	userId: z.string().min(1, { error: 'Choose a member.' }),
	role: projectRole
});

export const memberRemoveSchema = z.object({ userId: z.string().min(1, { error: 'Choose a member.' }) });
