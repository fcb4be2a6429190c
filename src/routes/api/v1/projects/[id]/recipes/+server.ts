import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { createRecipe, listRecipes } from '$lib/server/services/recipes';
import { recipeSetupSchema } from '$lib/schemas/recipe';

/** The project's recipes, newest first. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ recipes: listRecipes(project.id) });
});

/** Creates a recipe from a setup: 201, or 200 with the recipe already stored under the same hash. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editRecipes);
	const setup = await parseJson(event.request, recipeSetupSchema);
	const { recipe, created } = createRecipe(project.id, user.id, setup);
	return json({ recipe }, { status: created ? 201 : 200 });
});
