import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteDomain, getDomain, updateDomain } from '$lib/server/services/zonations';
import { domainUpdateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json(getDomain(project.id, event.params.did ?? ''));
});

/** Changes a domain; `members`, when given, replaces them. */
export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, domainUpdateSchema);
	return json({ domain: updateDomain(project.id, event.params.did ?? '', input) });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	deleteDomain(project.id, event.params.did ?? '');
	return new Response(null, { status: 204 });
});
