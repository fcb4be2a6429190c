import type { LayoutServerLoad } from './$types';
import { listProjectsForUser } from '$lib/server/services/projects';
import { usesLocalOutbox } from '$lib/server/mail';

export const load: LayoutServerLoad = ({ locals }) => {
	const user = locals.user;
	return {
		user,
		projects: user ? listProjectsForUser(user.id).map(({ id, name, role }) => ({ id, name, role })) : [],
		localOutbox: usesLocalOutbox()
	};
};
