import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { reviewRequestSchema } from '$lib/schemas/recipe';
import { requestReview } from '$lib/server/services/recipes';

/** Asks the project's reviewers to review the recipe (analyst); they are e-mailed a link. The body ({ note? }) may be empty. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editRecipes);
	const hasBody = Number(event.request.headers.get('content-length') ?? 0) > 0;
	const { note } = hasBody ? await parseJson(event.request, reviewRequestSchema) : { note: '' };
	return json(await requestReview(project.id, event.params.rid ?? '', user, note, event.url.origin));
});
