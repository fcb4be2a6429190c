import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { auditQuerySchema } from '$lib/schemas/audit';
import { auditCsv } from '$lib/server/services/audit';

/** The project's audit log as CSV, with the same filters (reviewer and up). */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.readAudit);
	const query = auditQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) throw new ApiError(422, 'The audit query is not valid.', query.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	const { kind, user } = query.data;
	return csvResponse(auditCsv(project.id, { kind, userId: user }), `${project.name}-audit-log.csv`);
});
