import { json } from '@sveltejs/kit';
import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { weakZonesQuerySchema } from '$lib/schemas/recipe';
import { jsonColumn } from '$lib/server/services/derived';
import { recipeWeakZonesOf } from '$lib/server/services/weak-zones';

/** Weak-zone continuity over the recipe's N realizations: ?property=…&threshold=…&minLength=…&boundary=… */
export const GET = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const query = parseQuery(event.url, weakZonesQuerySchema, 'weak-zones query');
	const w = await recipeWeakZonesOf(project.id, event.params.rid ?? '', query);
	return json({
		property: w.property,
		threshold: w.threshold,
		minLength: w.minLength,
		domains: w.domains,
		realizations: w.realizations.map((r) => ({ realization: r.realization, zones: r.zones, largestExtent: r.largestExtent, largestArea: r.largestArea, crossesBoundary: r.crossesBoundary })),
		crossingProbability: w.crossingProbability,
		probabilityMap: jsonColumn(w.probabilityMap)
	});
});
