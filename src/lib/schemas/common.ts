import { z } from 'zod';

/** E-mail addresses are compared lower-cased and trimmed everywhere. */
export const email = z
	.string({ error: 'Enter an e-mail address.' })
	.trim()
	.toLowerCase()
	.pipe(z.email({ error: 'Enter a valid e-mail address.' }).max(254, { error: 'That address is too long.' }));

/** A new password: long enough to resist guessing, short enough for scrypt to stay cheap. */
export const newPassword = z
	.string({ error: 'Enter a password.' })
	.min(10, { error: 'Use at least 10 characters.' })
	.max(200, { error: 'Use at most 200 characters.' });

export const projectRole = z.enum(['viewer', 'reviewer', 'analyst', 'owner'], {
	error: 'Choose a role: viewer, reviewer, analyst or owner.'
});
