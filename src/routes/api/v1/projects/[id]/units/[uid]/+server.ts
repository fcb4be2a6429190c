import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteUnit, getUnit, listUnits, updateUnit } from '$lib/server/services/stratigraphy';
import { unitUpdateSchema } from '$lib/schemas/stratigraphy';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const unit = getUnit(project.id, event.params.uid ?? '');
	return json({ unit: listUnits(project.id).find((u) => u.id === unit.id) });
});

export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const input = await parseJson(event.request, unitUpdateSchema);
	return json({ unit: updateUnit(project.id, event.params.uid ?? '', input) });
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	deleteUnit(project.id, event.params.uid ?? '');
	return new Response(null, { status: 204 });
});
