import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { csvResponse } from '$lib/server/download';
import { deriveSoundings } from '$lib/server/services/derived';
import { readingsCsv } from '$lib/server/services/readings-csv';
import { getSite } from '$lib/server/services/site';

const byName = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** Every reading of the project's soundings (or of `?s=id,id`) with its derived properties, as a streamed CSV. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const chosen = event.url.searchParams.get('s')?.split(',').filter(Boolean);
	const ids = chosen?.length ? chosen : undefined;
	const results = [...deriveSoundings(project.id, ids)].sort((a, b) => byName.compare(a.sounding.name, b.sounding.name));
	return csvResponse(readingsCsv(results, getSite(project.id).lengthUnit), `${project.name}-readings.csv`);
});
