import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recordExportDownload } from '$lib/server/services/audit';
import { streamResponse } from '$lib/server/download';
import { realizationNumber } from '$lib/server/exports/query';
import { fileQuerySchema } from '$lib/schemas/exports';
import { checkRealizations, exportContext, fileStem, realizationsVtk } from '$lib/server/services/exports';

/** Realization r as legacy VTK (binary), streamed from regeneration; `?transfer=` adds the transferred parameters. */
export const GET = endpoint((event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const r = realizationNumber(event.params.r);
	const q = parseQuery(event.url, fileQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', q.transfer ?? null);
	checkRealizations(ctx, [r]);
	const filename = `${fileStem(ctx)}_r${r}.vtk`;
	recordExportDownload({ projectId: project.id, recipe: ctx.recipe, file: filename, userId: user.id });
	const abort = new AbortController();
	return streamResponse(realizationsVtk(ctx, [r], [], abort.signal), {
		filename,
		contentType: 'application/octet-stream',
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash, 'x-engine-version': ctx.recipe.engineVersion }
	});
});
