import type { Actions, PageServerLoad } from './$types';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES, PROJECT_ROLES, can } from '$lib/server/auth/roles';
import { attempt, parseForm } from '$lib/server/forms';
import {
	changeMemberRole,
	inviteMember,
	listMembers,
	listPendingInvitations,
	removeMember,
	revokeInvitation
} from '$lib/server/services/members';
import { inviteSchema, memberRemoveSchema, memberRoleSchema } from '$lib/schemas';
import { z } from 'zod';

export const load: PageServerLoad = (event) => {
	const { project, role } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return {
		roles: PROJECT_ROLES,
		members: listMembers(project.id),
		invitations: can(role, 'manageMembers') ? listPendingInvitations(project.id) : []
	};
};

export const actions: Actions = {
	invite: async (event) => {
		const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
		const parsed = await parseForm(event.request, inviteSchema);
		if (!parsed.ok) return parsed.failure;
		const { email, role } = parsed.data;
		const result = await attempt(() => inviteMember(project, user, email, role, event.url.origin));
		return result.ok ? { invited: email } : result.failure;
	},
	role: async (event) => {
		const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
		const parsed = await parseForm(event.request, memberRoleSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => changeMemberRole(project.id, parsed.data.userId, parsed.data.role));
		return result.ok ? { updated: parsed.data.userId } : result.failure;
	},
	remove: async (event) => {
		const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
		const parsed = await parseForm(event.request, memberRemoveSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => removeMember(project.id, parsed.data.userId));
		return result.ok ? { removed: parsed.data.userId } : result.failure;
	},
	revokeInvite: async (event) => {
		const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.manageMembers);
		const parsed = await parseForm(event.request, z.object({ id: z.string().min(1) }));
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => revokeInvitation(project.id, parsed.data.id));
		return result.ok ? {} : result.failure;
	}
};
