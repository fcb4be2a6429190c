import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { domainStatisticsCsv } from '$lib/server/services/domain-statistics-csv';

/** The domain's statistics, pooled (declustered and equal weights) and per sounding, as CSV. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const { csv, name } = domainStatisticsCsv(project.id, event.params.did ?? '');
	return csvResponse([csv].values(), `${project.name}-${name}`);
});
