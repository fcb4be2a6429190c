import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { zonationStatisticsCsv } from '$lib/server/services/domain-statistics-csv';

/** The statistics of every domain of the zonation, one row each, as CSV. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const { csv, name } = zonationStatisticsCsv(project.id, event.params.zid ?? '');
	return csvResponse([csv].values(), `${project.name}-${name}`);
});
