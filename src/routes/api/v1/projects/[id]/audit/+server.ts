import { json } from '@sveltejs/kit';
import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { auditQuerySchema } from '$lib/schemas/audit';
import { auditPeople, listAudit } from '$lib/server/services/audit';

/** The project's audit log, newest first (its reviewers and owners): ?kind=&user=&before=&limit= */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.readAudit);
	const { kind, user, before, limit } = parseQuery(event.url, auditQuerySchema, 'audit query');
	const entries = listAudit(project.id, { kind, userId: user, before, limit: limit + 1 });
	return json({ entries: entries.slice(0, limit), next: entries.length > limit ? entries[limit - 1].id : null, people: auditPeople(project.id) });
});
