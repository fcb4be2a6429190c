import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recordExportDownload } from '$lib/server/services/audit';
import { streamResponse } from '$lib/server/download';
import { nodeChunks } from '$lib/server/exports/query';
import { zipQuerySchema } from '$lib/schemas/exports';
import { exportContext, zipFileName, zipRequest, zipStream } from '$lib/server/services/exports';

/**
 * A ZIP of realizations (`?realizations=0-19&format=csv|vtk`, optional `digits`, `transfer`, `maps`, `threshold`)
 * with a manifest and recipe.json, streamed as it is built.
 */
export const GET = endpoint((event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const q = parseQuery(event.url, zipQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', q.transfer ?? null);
	const req = zipRequest(ctx, q);
	const filename = zipFileName(ctx, req);
	recordExportDownload({ projectId: project.id, recipe: ctx.recipe, file: filename, userId: user.id });
	const abort = new AbortController();
	return streamResponse(nodeChunks(zipStream(ctx, req, abort.signal)), {
		filename,
		contentType: 'application/zip',
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash, 'x-engine-version': ctx.recipe.engineVersion }
	});
});
