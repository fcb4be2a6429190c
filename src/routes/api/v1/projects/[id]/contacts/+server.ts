import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteContact, listContacts, putContact } from '$lib/server/services/stratigraphy';
import { contactDeleteSchema, contactPutSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ contacts: listContacts(project.id) });
});

/** Sets one contact: the top elevation of a unit at a sounding. */
export const PUT = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, contactPutSchema);
	return json({ contact: putContact(project.id, input) });
});

export const DELETE = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const { soundingId, unitId } = await parseJson(event.request, contactDeleteSchema);
	deleteContact(project.id, soundingId, unitId);
	return new Response(null, { status: 204 });
});
