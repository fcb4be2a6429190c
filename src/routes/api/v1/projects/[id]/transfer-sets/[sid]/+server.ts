import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { resolvedTransferSet } from '$lib/server/services/transfers';

/** A transfer set with the table versions it names. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ set: resolvedTransferSet(project.id, event.params.sid ?? '') });
});
