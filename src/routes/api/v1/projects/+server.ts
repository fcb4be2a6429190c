import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/guard';
import { createProject, listProjectsForUser } from '$lib/server/services/projects';
import { projectCreateSchema } from '$lib/schemas';

/** The caller's projects. */
export const GET = endpoint((event) => {
	const user = requireUser(event);
	return json({ projects: listProjectsForUser(user.id) });
});

/** Creates a project; the caller becomes its owner. */
export const POST = endpoint(async (event) => {
	const user = requireUser(event);
	const input = await parseJson(event.request, projectCreateSchema);
	return json({ project: createProject(user.id, input) }, { status: 201 });
});
