import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { transferSetSaveSchema } from '$lib/schemas/exports';
import { listTransferSets, saveTransferSet } from '$lib/server/services/transfers';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ sets: listTransferSets(project.id) });
});

/** Saves a transfer set as the next version of its name (analyst); 422 names each output that does not fit its rule. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editModels);
	const input = await parseJson(event.request, transferSetSaveSchema);
	return json({ set: saveTransferSet(project.id, user.id, input) }, { status: 201 });
});
