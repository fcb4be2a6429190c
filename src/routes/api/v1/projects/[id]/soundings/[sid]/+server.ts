import { json } from '@sveltejs/kit';
import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { deriveSounding } from '$lib/server/services/derived';
import { readingsPageJson, readingsPageSchema } from '$lib/server/services/sounding-readings';
import { deleteSounding, getSounding } from '$lib/server/services/soundings';

/**
 * One sounding: its location and source, the measured columns (m, kPa) and the derived properties (null for
 * NaN), for readings `offset` … `offset + limit` (default: all, up to 100 000; `readings.next` pages on).
 */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'viewer');
	const page = readingsPageSchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!page.success) throw new ApiError(422, 'The readings page is not valid.', page.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	const detail = getSounding(project.id, event.params.sid ?? '');
	const derived = deriveSounding(project.id, detail.id);
	const { columns: _columns, ...sounding } = detail;
	return json({
		sounding,
		groundwater: { elevation: derived.sounding.groundwaterElevation, source: derived.sounding.groundwaterSource },
		...readingsPageJson(detail, derived, page.data, event.url),
		units: derived.units,
		warnings: derived.warnings
	});
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'analyst');
	deleteSounding(project.id, event.params.sid ?? '');
	return new Response(null, { status: 204 });
});
