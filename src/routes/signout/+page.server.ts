import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signOutFrom } from '$lib/server/auth';

export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/signin');
};

export const actions: Actions = {
	default: async (event) => {
		await signOutFrom(event, '/signin');
	}
};
