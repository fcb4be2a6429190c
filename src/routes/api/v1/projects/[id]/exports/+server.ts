import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { exportJobSchema } from '$lib/schemas/exports';
import { listExports, startExport } from '$lib/server/services/export-jobs';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ exports: listExports(project.id) });
});

/** Starts an export job (the body of export.zip's query as JSON): 202 {export: {id, status, progress, …}}. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const input = await parseJson(event.request, exportJobSchema);
	return json({ export: startExport(project.id, user.id, input, event.url.origin) }, { status: 202 });
});
