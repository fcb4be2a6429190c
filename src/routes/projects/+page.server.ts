import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/auth/guard';
import { listProjectsForUser } from '$lib/server/services/projects';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	return { projects: listProjectsForUser(user.id) };
};
