import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { contactsCsv } from '$lib/server/services/contacts';

/** The contacts table: one row per sounding, each unit's top elevation and where it comes from, as CSV. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return csvResponse([contactsCsv(project.id)].values(), `${project.name}-contacts.csv`);
});
