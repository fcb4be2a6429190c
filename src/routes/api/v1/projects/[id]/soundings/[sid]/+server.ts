import { json } from '@sveltejs/kit';
import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { readingsPageSchema } from '$lib/server/services/sounding-readings';
import { deleteSounding, soundingDetailView } from '$lib/server/services/soundings';

/**
 * One sounding: its location and source, the measured columns (m, kPa) and the derived properties (null for
 * NaN), for readings `offset` … `offset + limit` (default: all, up to 100 000; `readings.next` pages on).
 */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const page = parseQuery(event.url, readingsPageSchema, 'readings page');
	return json(soundingDetailView(project.id, event.params.sid ?? '', page, event.url));
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	deleteSounding(project.id, event.params.sid ?? '');
	return new Response(null, { status: 204 });
});
