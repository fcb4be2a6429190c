import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { approvalSchema } from '$lib/schemas/recipe';
import { approveRecipe } from '$lib/server/services/recipes';

/** Approves the recipe with a comment (reviewer, not its author): its hash is recorded and it is frozen. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.approve);
	const { comment } = await parseJson(event.request, approvalSchema);
	return json(await approveRecipe(project.id, event.params.rid ?? '', user, comment, event.url.origin));
});
