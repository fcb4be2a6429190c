import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { changeMemberRole, inviteMember, listMembers, removeMember } from '$lib/server/services/members';
import { inviteSchema, memberRemoveSchema, memberRoleSchema } from '$lib/schemas';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ members: listMembers(project.id) });
});

/** Invites an address with a role; the invitation is mailed. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
	const { email, role } = await parseJson(event.request, inviteSchema);
	return json({ invitation: await inviteMember(project, user, email, role, event.url.origin) }, { status: 201 });
});

export const PATCH = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
	const { userId, role } = await parseJson(event.request, memberRoleSchema);
	changeMemberRole(project.id, userId, role);
	return json({ members: listMembers(project.id) });
});

export const DELETE = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
	const { userId } = await parseJson(event.request, memberRemoveSchema);
	removeMember(project.id, userId);
	return new Response(null, { status: 204 });
});
