import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { auditQuerySchema } from '$lib/schemas/audit';
import { auditCsv } from '$lib/server/services/audit';

/** The project's audit log as CSV, with the same filters (its reviewers and owners). */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.readAudit);
	const { kind, user } = parseQuery(event.url, auditQuerySchema, 'audit query');
	return csvResponse(auditCsv(project.id, { kind, userId: user }), `${project.name}-audit-log.csv`);
});
