import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { deriveSounding } from '$lib/server/services/derived';
import { readingsCsv } from '$lib/server/services/readings-csv';
import { getSite } from '$lib/server/services/site';

/** The readings of one sounding with its derived properties, as a streamed CSV. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const result = deriveSounding(project.id, event.params.sid ?? '');
	return csvResponse(readingsCsv([result], getSite(project.id).lengthUnit), `${project.name}-${result.sounding.name}-readings.csv`);
});
