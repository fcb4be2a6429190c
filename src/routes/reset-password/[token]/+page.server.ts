import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { attempt, parseForm } from '$lib/server/forms';
import { findPasswordReset, resetPassword } from '$lib/server/services/users';
import { resetPasswordSchema } from '$lib/schemas';

export const load: PageServerLoad = ({ params }) => {
	const reset = findPasswordReset(params.token);
	return { email: reset?.user.email ?? null };
};

export const actions: Actions = {
	default: async (event) => {
		const parsed = await parseForm(event.request, resetPasswordSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => resetPassword(event.params.token, parsed.data.password));
		if (!result.ok) return result.failure;
		redirect(303, '/signin?reset=1');
	}
};
