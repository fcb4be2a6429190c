import { isRedirect, redirect } from '@sveltejs/kit';
import { CredentialsSignin } from '@auth/sveltekit';
import type { Actions, PageServerLoad } from './$types';
import { requestSignInLink, signInWith } from '$lib/server/auth';
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
	 * check-your-mail page, no cookie — equally fast: the account is looked up and the link sent after the
	 * response, so the form does not reveal who has an account.
	 */
	link: async (event) => {
		const parsed = await parseForm(event.request, magicLinkSchema);
		if (!parsed.ok) return parsed.failure;
		requestSignInLink(event, parsed.data.email, parsed.data.redirectTo);
		redirect(303, '/signin/check-email');
	}
};
