import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES, can } from '$lib/server/auth/roles';
import { deleteExport, getExport } from '$lib/server/services/export-jobs';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ export: getExport(project.id, event.params.eid ?? '') });
});

/** Cancels a queued or running export (it stays listed), or deletes a finished one and its file. */
export const DELETE = endpoint((event) => {
	const { project, user, role } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	deleteExport(project.id, event.params.eid ?? '', user.id, can(role, 'editRecipes'));
	return new Response(null, { status: 204 });
});
