import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recordExportDownload } from '$lib/server/services/audit';
import { streamResponse } from '$lib/server/download';
import { mapsQuerySchema } from '$lib/schemas/exports';
import { exportContext, fileStem, mapsAsked, realizationsVtk } from '$lib/server/services/exports';

/** The ensemble maps over the N realizations as legacy VTK (the same query as maps.csv). */
export const GET = endpoint((event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const q = parseQuery(event.url, mapsQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', null);
	const maps = mapsAsked(q.stats, q.threshold);
	const filename = `${fileStem(ctx)}_maps.vtk`;
	recordExportDownload({ projectId: project.id, recipe: ctx.recipe, file: filename, userId: user.id });
	const abort = new AbortController();
	return streamResponse(realizationsVtk(ctx, [], maps, abort.signal), {
		filename,
		contentType: 'application/octet-stream',
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash }
	});
});
