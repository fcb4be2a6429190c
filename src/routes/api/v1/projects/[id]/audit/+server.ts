import { json } from '@sveltejs/kit';
import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { auditQuerySchema } from '$lib/schemas/audit';
import { auditPeople, listAudit } from '$lib/server/services/audit';

/** The project's audit log, newest first (reviewer and up): ?kind=&user=&before=&limit= */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.readAudit);
	const query = auditQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) throw new ApiError(422, 'The audit query is not valid.', query.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	const { kind, user, before, limit } = query.data;
	const entries = listAudit(project.id, { kind, userId: user, before, limit: limit + 1 });
	return json({ entries: entries.slice(0, limit), next: entries.length > limit ? entries[limit - 1].id : null, people: auditPeople(project.id) });
});
