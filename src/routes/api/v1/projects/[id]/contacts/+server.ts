import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteContact, editContacts, listContacts, putContact } from '$lib/server/services/contacts';
import { contactDeleteSchema, contactPutSchema, contactsPatchSchema } from '$lib/schemas/stratigraphy';

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

/** Several edits at once, all or nothing (a pasted block, an undo). */
export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, contactsPatchSchema);
	const changed = editContacts(project.id, input);
	return json({ changed, contacts: listContacts(project.id) });
});

export const DELETE = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const { soundingId, unitId } = await parseJson(event.request, contactDeleteSchema);
	deleteContact(project.id, soundingId, unitId);
	return new Response(null, { status: 204 });
});
