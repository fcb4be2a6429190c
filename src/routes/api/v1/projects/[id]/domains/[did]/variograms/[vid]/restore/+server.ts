import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { restoreVariogram } from '$lib/server/services/variograms';
import { variogramRestoreSchema } from '$lib/schemas/variogram';

/** Saves the old version's parameters as the newest version of its name. The body ({ note? }) may be empty. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editModels);
	const hasBody = Number(event.request.headers.get('content-length') ?? 0) > 0;
	const { note } = hasBody ? await parseJson(event.request, variogramRestoreSchema) : { note: undefined };
	const { did, vid } = event.params;
	return json({ variogram: restoreVariogram(project.id, did!, vid!, user.id, note) }, { status: 201 });
});
