import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { streamResponse } from '$lib/server/download';

import { mapsQuerySchema } from '$lib/schemas/exports';
import { exportContext, fileStem, mapsAsked, mapsCsvFile } from '$lib/server/services/exports';

/** The ensemble maps over the N realizations as CSV (`?stats=mean,sd,p10,p50,p90,below&threshold=`; default all but P(below)). */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const q = parseQuery(event.url, mapsQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', null);
	const abort = new AbortController();
	return streamResponse(mapsCsvFile(ctx, mapsAsked(q.stats, q.threshold), q.digits ?? null), {
		filename: `${fileStem(ctx)}_maps.csv`,
		contentType: 'text/csv; charset=utf-8',
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash }
	});
});
