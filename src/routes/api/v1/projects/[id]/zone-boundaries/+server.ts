import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { createZoneBoundary, deleteZoneBoundary, listZoneBoundaries, updateZoneBoundary } from '$lib/server/services/stratigraphy';
import { zoneBoundaryDeleteSchema, zoneBoundarySchema, zoneBoundaryUpdateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ boundaries: listZoneBoundaries(project.id) });
});

export const POST = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, zoneBoundarySchema);
	return json({ boundary: createZoneBoundary(project.id, input) }, { status: 201 });
});

/** Moves a boundary: `{ id, unitId, chainageTop, elevationTop, chainageBottom, elevationBottom }`. */
export const PUT = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const { id, ...input } = await parseJson(event.request, zoneBoundaryUpdateSchema);
	return json({ boundary: updateZoneBoundary(project.id, id, input) });
});

export const DELETE = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const { id } = await parseJson(event.request, zoneBoundaryDeleteSchema);
	deleteZoneBoundary(project.id, id);
	return new Response(null, { status: 204 });
});
