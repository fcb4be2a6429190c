import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { listVariograms, saveVariogram } from '$lib/server/services/variograms';
import { variogramSaveSchema } from '$lib/schemas/variogram';

/** The domain's saved variograms, every version, newest first. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ variograms: listVariograms(project.id, event.params.did!) });
});

/** Saves a model as the next version of its name. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editModels);
	const input = await parseJson(event.request, variogramSaveSchema);
	return json({ variogram: saveVariogram(project.id, event.params.did!, user.id, input) }, { status: 201 });
});
