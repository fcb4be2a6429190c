import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { createZonation, listZonations } from '$lib/server/services/zonations';
import { zonationCreateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ zonations: listZonations(project.id) });
});

/** Creates a zonation, optionally with its domains: `{ name, description?, domains?: [...] }`. */
export const POST = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, zonationCreateSchema);
	return json({ zonation: createZonation(project.id, input) }, { status: 201 });
});
