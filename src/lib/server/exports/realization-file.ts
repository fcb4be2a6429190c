/**
 * One realization of a recipe as a file (GET …/realizations/:r.csv and :r.vtk): the download role, the realization
 * number and query checked, the download recorded in the audit log, then the file streamed from regeneration.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { streamResponse } from '$lib/server/download';
import { recordExportDownload } from '$lib/server/services/audit';
import { checkRealizations, exportContext, fileStem, type ExportContext } from '$lib/server/services/exports';
import { fileQuerySchema } from '$lib/schemas/exports';
import type { z } from 'zod';
import { realizationNumber } from './query';

export interface RealizationFormat {
	extension: 'csv' | 'vtk';
	contentType: string;
	/** The file's chunks for realization r. */
	chunks(ctx: ExportContext, r: number, query: z.output<typeof fileQuerySchema>, signal: AbortSignal): AsyncGenerator<Uint8Array | string>;
}

/** Realization `:r` of recipe `:rid` in `format`, streamed; refusals as the export API's (404, 422, 409). */
export function realizationFile(event: RequestEvent<Record<string, string>>, format: RealizationFormat): Response {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const r = realizationNumber(event.params.r);
	const q = parseQuery(event.url, fileQuerySchema);
	const ctx = exportContext(project.id, event.params.rid ?? '', q.transfer ?? null);
	checkRealizations(ctx, [r]);
	const filename = `${fileStem(ctx)}_r${r}.${format.extension}`;
	recordExportDownload({ projectId: project.id, recipe: ctx.recipe, file: filename, userId: user.id });
	const abort = new AbortController();
	return streamResponse(format.chunks(ctx, r, q, abort.signal), {
		filename,
		contentType: format.contentType,
		abort,
		headers: { 'x-recipe-hash': ctx.recipe.hash, 'x-engine-version': ctx.recipe.engineVersion }
	});
}
