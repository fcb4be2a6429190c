import { json } from '@sveltejs/kit';
import { endpoint, parseQuery } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { summaryQuerySchema } from '$lib/schemas/recipe';
import { jsonColumn } from '$lib/server/services/derived';
import { recipeSummary } from '$lib/server/services/summaries';

/** An ensemble map over the recipe's N realizations: ?stat=mean|sd|p10|p50|p90|below&threshold=… */
export const GET = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const query = parseQuery(event.url, summaryQuerySchema, 'summary query');
	const s = await recipeSummary(project.id, event.params.rid ?? '', query.stat, query.threshold);
	return json({ hash: s.hash, stat: s.stat, threshold: s.threshold, realizations: s.realizations, values: jsonColumn(s.values) });
});
