import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recipeCommentSchema } from '$lib/schemas/recipe';
import { commentOnRecipe, listRecipeNotes } from '$lib/server/services/recipes';

/** The recipe's thread, oldest first: comments, review requests and the approval. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ comments: listRecipeNotes(project.id, event.params.rid ?? '') });
});

/** A comment (reviewer); the recipe's author is e-mailed. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.comment);
	const { body } = await parseJson(event.request, recipeCommentSchema);
	return json(await commentOnRecipe(project.id, event.params.rid ?? '', user, body, event.url.origin), { status: 201 });
});
