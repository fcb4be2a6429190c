import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { listVariograms, saveVariogram, VARIOGRAM_ROLES } from '$lib/server/services/variograms';
import { variogramSaveSchema } from '$lib/schemas/variogram';

/** The domain's saved variograms, every version, newest first. */
export const GET = endpoint((event) => {
	const { project, user, role } = requireProjectRole(event, event.params.id, VARIOGRAM_ROLES.read);
	return json({ variograms: listVariograms(project.id, event.params.did!, { userId: user.id, role }) });
});

/** Saves a model as the next version of its name. */
export const POST = endpoint(async (event) => {
	const { project, user, role } = requireProjectRole(event, event.params.id, VARIOGRAM_ROLES.save);
	const input = await parseJson(event.request, variogramSaveSchema);
	return json({ variogram: saveVariogram(project.id, event.params.did!, { userId: user.id, role }, input) }, { status: 201 });
});
