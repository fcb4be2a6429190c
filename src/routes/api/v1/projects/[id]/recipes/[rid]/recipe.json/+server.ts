import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { recipeDocument } from '$lib/server/services/recipes';

/** The recipe's canonical JSON, byte for byte as stored: its SHA-256 is the recipe's hash. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const { hash, text } = recipeDocument(project.id, event.params.rid ?? '');
	return new Response(text, {
		headers: { 'content-type': 'application/json; charset=utf-8', etag: `"${hash}"`, 'cache-control': 'private, max-age=0, must-revalidate' }
	});
});
