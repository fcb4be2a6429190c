import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteMesh, getMesh } from '$lib/server/services/meshes';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ mesh: getMesh(project.id, event.params.mid ?? '') });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	deleteMesh(project.id, event.params.mid ?? '');
	return new Response(null, { status: 204 });
});
