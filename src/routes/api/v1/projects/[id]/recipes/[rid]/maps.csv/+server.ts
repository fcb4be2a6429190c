import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recordExportDownload } from '$lib/server/services/audit';
import { streamResponse } from '$lib/server/download';
import { mapsQuerySchema } from '$lib/schemas/exports';
import { exportContext, fileStem, mapsAsked, mapsCsvFile } from '$lib/server/services/exports';

/** The ensemble maps over the N realizations as CSV (`?stats=mean,sd,p10,p50,p90,below&threshold=`; default all but P(below)). */
export const GET = endpoint((event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const q = parseQuery(event.url, mapsQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', null);
	const maps = mapsAsked(q.stats, q.threshold);
	const filename = `${fileStem(ctx)}_maps.csv`;
	recordExportDownload({ projectId: project.id, recipe: ctx.recipe, file: filename, userId: user.id });
	const abort = new AbortController();
	return streamResponse(mapsCsvFile(ctx, maps, q.digits ?? null), {
		filename,
		contentType: 'text/csv; charset=utf-8',
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash }
	});
});
