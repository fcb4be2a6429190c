import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recordExportDownload } from '$lib/server/services/audit';
import { streamResponse } from '$lib/server/download';
import { realizationNumber } from '$lib/server/exports/query';
import { fileQuerySchema } from '$lib/schemas/exports';
import { checkRealizations, exportContext, fileStem, realizationCsv } from '$lib/server/services/exports';

/** Realization r as CSV, streamed from regeneration: `?digits=` significant digits, `?transfer=` a transfer set. */
export const GET = endpoint((event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const r = realizationNumber(event.params.r);
	const q = parseQuery(event.url, fileQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', q.transfer ?? null);
	checkRealizations(ctx, [r]);
	const filename = `${fileStem(ctx)}_r${r}.csv`;
	recordExportDownload({ projectId: project.id, recipe: ctx.recipe, file: filename, userId: user.id });
	const abort = new AbortController();
	return streamResponse(realizationCsv(ctx, r, q.digits ?? null, abort.signal), {
		filename,
		contentType: 'text/csv; charset=utf-8',
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash, 'x-engine-version': ctx.recipe.engineVersion }
	});
});
