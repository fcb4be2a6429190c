import { z } from 'zod';
import { displayName } from './common';

export const TOKEN_LIFETIMES_DAYS = [7, 30, 90, 365] as const;

export const apiTokenCreateSchema = z.object({
	name: displayName(60, { required: 'Name the token.', tooLong: 'Use at most 60 characters.' }),
	// A number (JSON) or the digits of one (a form field); anything else — [7], true, "7 days" — is refused.
	expiresInDays: z
		.union([z.number(), z.string().regex(/^\d{1,4}$/).transform(Number)], { error: 'Choose an expiry: 7, 30, 90 or 365 days.' })
		.refine((d) => (TOKEN_LIFETIMES_DAYS as readonly number[]).includes(d), {
			error: 'Choose 7, 30, 90 or 365 days.'
		})
});

export const apiTokenRevokeSchema = z.object({ id: z.string().min(1) });
