import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { getVariogram, VARIOGRAM_ROLES } from '$lib/server/services/variograms';

export const GET = endpoint((event) => {
	const { project, user, role } = requireProjectRole(event, event.params.id, VARIOGRAM_ROLES.read);
	const { did, vid } = event.params;
	return json({ variogram: getVariogram(project.id, did!, vid!, { userId: user.id, role }) });
});
