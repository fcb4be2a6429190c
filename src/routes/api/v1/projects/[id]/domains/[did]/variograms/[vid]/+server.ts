import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { getVariogram } from '$lib/server/services/variograms';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const { did, vid } = event.params;
	return json({ variogram: getVariogram(project.id, did!, vid!) });
});
