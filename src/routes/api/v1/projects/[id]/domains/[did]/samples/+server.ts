import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { domainSamples } from '$lib/server/services/domains';

/** The domain's conditioning data, declustering weights, CDFs and statistics (NaN statistics of an empty domain are null). */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json(domainSamples(project.id, event.params.did ?? ''));
});
