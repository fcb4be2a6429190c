import type { LayoutServerLoad } from './$types';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES, capabilitiesOf } from '$lib/server/auth/roles';
import { projectView } from '$lib/server/services/projects';

export const load: LayoutServerLoad = (event) => {
	const { project, role } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return { project: projectView(project, role), can: capabilitiesOf(role) };
};
