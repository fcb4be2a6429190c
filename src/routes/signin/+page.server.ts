import { isRedirect, redirect } from '@sveltejs/kit';
import { AuthError, CredentialsSignin } from '@auth/sveltekit';
import type { Actions, PageServerLoad } from './$types';
import { signInWith } from '$lib/server/auth';
import { checkThrottle, throttleMessage } from '$lib/server/auth/throttle';
import { getDb } from '$lib/server/db';
import { formFailure, parseForm } from '$lib/server/forms';
import { magicLinkSchema, signInFormSchema } from '$lib/schemas';
import { safeRedirectPath } from '$lib/redirect';

/** Messages for the `error`/`code` query parameters Auth.js redirects with. */
const AUTH_MESSAGES: Record<string, string> = {
	Verification: 'That sign-in link has expired or was already used. Ask for a new one.',
	AccessDenied: 'That account cannot sign in. Ask an administrator.',
	CredentialsSignin: 'E-mail or password is not right.',
	disabled: 'This account is disabled. Ask an administrator.',
	throttled: 'Too many failed sign-in attempts. Wait a few minutes and try again.'
};

export const load: PageServerLoad = ({ locals, url }) => {
	const redirectTo = safeRedirectPath(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	const key = url.searchParams.get('code') ?? url.searchParams.get('error');
	return {
		redirectTo,
		notice: url.searchParams.get('reset') ? 'Your password was changed. Sign in with the new one.' : null,
		authError: key ? (AUTH_MESSAGES[key] ?? 'Sign-in failed. Try again.') : null
	};
};

export const actions: Actions = {
	password: async (event) => {
		const parsed = await parseForm(event.request, signInFormSchema);
		if (!parsed.ok) return parsed.failure;
		const { email, password, redirectTo } = parsed.data;
		try {
			await signInWith(event, 'credentials', { email, password, redirectTo });
		} catch (err) {
			if (isRedirect(err)) throw err;
			if (!(err instanceof CredentialsSignin)) throw err;
			const message =
				err.code === 'throttled'
					? throttleMessage(checkThrottle(getDb(), email, event.getClientAddress()))
					: (AUTH_MESSAGES[err.code] ?? AUTH_MESSAGES.CredentialsSignin);
			return formFailure(err.code === 'throttled' ? 429 : 400, message, { email });
		}
	},
	/**
	 * Mails a one-time sign-in link to an enabled account. Every address gets the same answer — 303 to the
	 * check-your-mail page, no cookie — and as quickly (the mail goes out in the background), so the form does
	 * not reveal who has an account.
	 */
	link: async (event) => {
		const parsed = await parseForm(event.request, magicLinkSchema);
		if (!parsed.ok) return parsed.failure;
		const { email, redirectTo } = parsed.data;
		try {
			await signInWith(event, 'nodemailer', { email, redirectTo });
		} catch (err) {
			// Auth.js answers a known address with a redirect and refuses an unknown or disabled one (AccessDenied).
			if (!isRedirect(err) && !(err instanceof AuthError && err.type === 'AccessDenied')) throw err;
		}
		// Auth.js leaves a callback-url cookie that differs between the two cases; the link carries its own.
		event.cookies.delete('authjs.callback-url', { path: '/' });
		redirect(303, '/signin/check-email');
	}
};
