import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { createDomain, deleteZonation, getZonation, updateZonation } from '$lib/server/services/zonations';
import { domainCreateSchema, zonationUpdateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ zonation: getZonation(project.id, event.params.zid ?? '') });
});

export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, zonationUpdateSchema);
	return json({ zonation: updateZonation(project.id, event.params.zid ?? '', input) });
});

/** Adds a domain to the zonation. */
export const POST = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, domainCreateSchema);
	return json({ domain: createDomain(project.id, event.params.zid ?? '', input) }, { status: 201 });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	deleteZonation(project.id, event.params.zid ?? '');
	return new Response(null, { status: 204 });
});
