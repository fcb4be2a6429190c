import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { sectionView } from '$lib/server/services/stratigraphy';
import { sectionProperty } from '$lib/schemas/stratigraphy';

/** The section: each located sounding's trace of `?property=` (default qc1Ncs), contacts and zone boundaries. */
export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const property = sectionProperty.parse(event.url.searchParams.get('property') ?? 'qc1Ncs');
	return json(sectionView(project.id, property));
});
