import type { PageServerLoad } from './$types';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';

/** The audit log is read by the project's reviewers and owners (CAPABILITIES.readAudit); the entries come from the API. */
export const load: PageServerLoad = (event) => {
	requireProjectRole(event, event.params.id, CAPABILITIES.readAudit);
	return {};
};
