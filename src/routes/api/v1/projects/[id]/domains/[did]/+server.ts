import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { deleteDomain, getDomain, updateDomain } from '$lib/server/services/zonations';
import { domainUpdateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'viewer');
	return json(getDomain(project.id, event.params.did ?? ''));
});

/** Changes a domain; `members`, when given, replaces them. */
export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, 'analyst');
	const input = await parseJson(event.request, domainUpdateSchema);
	return json({ domain: updateDomain(project.id, event.params.did ?? '', input) });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'analyst');
	deleteDomain(project.id, event.params.did ?? '');
	return new Response(null, { status: 204 });
});
