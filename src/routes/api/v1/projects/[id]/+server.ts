import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteProject, projectView, updateProject } from '$lib/server/services/projects';
import { projectUpdateSchema } from '$lib/schemas';

export const GET = endpoint((event) => {
	const { project, role } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ project: projectView(project, role) });
});

export const PATCH = endpoint(async (event) => {
	const { project, role } = requireProjectRole(event, event.params.id, CAPABILITIES.editProject);
	const input = await parseJson(event.request, projectUpdateSchema);
	return json({ project: updateProject(project, role, input) });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.deleteProject);
	deleteProject(project.id);
	return new Response(null, { status: 204 });
});
