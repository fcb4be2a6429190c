import { redirect } from '@sveltejs/kit';
import type { Actions } from './$types';
import { requireUser } from '$lib/server/auth/guard';
import { parseForm } from '$lib/server/forms';
import { createProject } from '$lib/server/services/projects';
import { projectCreateSchema } from '$lib/schemas';

export const actions: Actions = {
	create: async (event) => {
		const user = requireUser(event);
		const parsed = await parseForm(event.request, projectCreateSchema);
		if (!parsed.ok) return parsed.failure;
		const project = createProject(user.id, parsed.data);
		redirect(303, `/projects/${project.id}`);
	}
};
