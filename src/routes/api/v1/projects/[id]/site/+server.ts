import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { getSite } from '$lib/server/services/site';
import { changeSite } from '$lib/server/services/stratigraphy';
import { siteUpdateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ site: getSite(project.id) });
});

export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, siteUpdateSchema);
	return json({ site: changeSite(project.id, input) });
});
