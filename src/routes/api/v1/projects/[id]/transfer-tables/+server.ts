import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { transferTableSaveSchema } from '$lib/schemas/exports';
import { listTransferTables, saveTransferTable } from '$lib/server/services/transfers';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ tables: listTransferTables(project.id) });
});

/** Saves a lookup table as the next version of its name (analyst). */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editModels);
	const input = await parseJson(event.request, transferTableSaveSchema);
	return json({ table: saveTransferTable(project.id, user.id, input) }, { status: 201 });
});
