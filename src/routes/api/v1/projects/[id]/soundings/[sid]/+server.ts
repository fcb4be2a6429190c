import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { deleteSounding, soundingDetailView } from '$lib/server/services/soundings';

/** One sounding: its location and source, the measured columns (m, kPa) and the derived properties (null for NaN). */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json(soundingDetailView(project.id, event.params.sid ?? ''));
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	deleteSounding(project.id, event.params.sid ?? '');
	return new Response(null, { status: 204 });
});
