import { z } from 'zod';

export const TOKEN_LIFETIMES_DAYS = [7, 30, 90, 365] as const;

export const apiTokenCreateSchema = z.object({
	name: z
		.string({ error: 'Name the token.' })
		.trim()
		.min(1, { error: 'Name the token.' })
		.max(60, { error: 'Use at most 60 characters.' }),
	expiresInDays: z.coerce
		.number({ error: 'Choose an expiry.' })
		.refine((d) => (TOKEN_LIFETIMES_DAYS as readonly number[]).includes(d), {
			error: 'Choose 7, 30, 90 or 365 days.'
		})
});

export const apiTokenRevokeSchema = z.object({ id: z.string().min(1) });
