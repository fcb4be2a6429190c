import { z } from 'zod';
import { safeRedirectPath } from '$lib/redirect';
import { displayName, email, newPassword } from './common';

/** Only same-site paths, so a sign-in link cannot send the user elsewhere (see safeRedirectPath). */
const localPath = z
	.string()
	.optional()
	.transform((v) => safeRedirectPath(v));

export const signInSchema = z.object({
	email,
	password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200)
});

export const signInFormSchema = signInSchema.extend({ redirectTo: localPath });

export const magicLinkSchema = z.object({ email, redirectTo: localPath });

export const changePasswordSchema = z
	.object({
		current: z.string().min(1, { error: 'Enter your current password.' }),
		password: newPassword,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, { path: ['confirm'], error: 'The two passwords differ.' });

export const resetPasswordSchema = z
	.object({ password: newPassword, confirm: z.string() })
	.refine((v) => v.password === v.confirm, { path: ['confirm'], error: 'The two passwords differ.' });

export const acceptInvitationSchema = z
	.object({
		name: displayName(100, { required: 'Enter your name.', tooLong: 'Use at most 100 characters.' }),
		password: newPassword,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, { path: ['confirm'], error: 'The two passwords differ.' });
