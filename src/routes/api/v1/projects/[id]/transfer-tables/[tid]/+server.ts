import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { getTransferTable } from '$lib/server/services/transfers';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ table: getTransferTable(project.id, event.params.tid ?? '') });
});
