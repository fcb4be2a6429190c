import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { derivedJson, deriveSounding, jsonColumn } from '$lib/server/services/derived';
import { deleteSounding, getSounding } from '$lib/server/services/soundings';

/** One sounding: its location and source, the measured columns (m, kPa) and the derived properties (null for NaN). */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'viewer');
	const { columns, ...sounding } = getSounding(project.id, event.params.sid ?? '');
	const derived = deriveSounding(project.id, sounding.id);
	return json({
		sounding,
		groundwater: { elevation: derived.sounding.groundwaterElevation, source: derived.sounding.groundwaterSource },
		columns: {
			depth: jsonColumn(columns.depth),
			qc: jsonColumn(columns.qc),
			fs: jsonColumn(columns.fs),
			u2: columns.u2 ? jsonColumn(columns.u2) : null,
			extras: Object.fromEntries(Object.entries(columns.extras).map(([k, v]) => [k, jsonColumn(v)]))
		},
		derived: derivedJson(derived),
		unit: Array.from(derived.unit),
		flags: Array.from(derived.flags),
		units: derived.units,
		warnings: derived.warnings
	});
});

export const DELETE = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'analyst');
	deleteSounding(project.id, event.params.sid ?? '');
	return new Response(null, { status: 204 });
});
