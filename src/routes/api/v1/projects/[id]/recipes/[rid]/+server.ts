import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteRecipe, getRecipe } from '$lib/server/services/recipes';

/** One recipe: its summary, the setup it was made from and its provenance. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ recipe: getRecipe(project.id, event.params.rid ?? '') });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editRecipes);
	deleteRecipe(project.id, event.params.rid ?? '');
	return new Response(null, { status: 204 });
});
