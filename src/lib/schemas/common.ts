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

/**
 * True when a name has something to see: not only spaces, zero-width and other format characters
 * (U+200B–U+200F, U+2060, U+FEFF …), control characters or the Hangul and Braille blanks.
 */
export function hasVisibleCharacter(value: string): boolean {
	return /[^\p{Cf}\p{Z}\p{Cc}\s\u115F\u1160\u3164\uFFA0\u2800]/u.test(value);
}

/** A name people will read (project, token, unit …): trimmed, 1–`max` characters, at least one of them visible. */
export function displayName(max: number, messages: { required: string; tooLong: string }) {
	return z
		.string({ error: messages.required })
		.trim()
		// An empty name gets one message, not a second about visible characters.
		.min(1, { error: messages.required, abort: true })
		.max(max, { error: messages.tooLong })
		.refine(hasVisibleCharacter, { error: `${messages.required.replace(/\.$/, '')} with at least one visible character.` });
}
