import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signInWith } from '$lib/server/auth';
import { requireUser } from '$lib/server/auth/guard';
import { attempt, parseForm } from '$lib/server/forms';
import { acceptInvitation, findInvitation, registerFromInvitation } from '$lib/server/services/members';
import { findUserByEmail } from '$lib/server/services/users';
import { acceptInvitationSchema } from '$lib/schemas';

export const load: PageServerLoad = ({ params, locals }) => {
	const invitation = findInvitation(params.token);
	if (!invitation) return { invitation: null, hasAccount: false, signedInAs: locals.user?.email ?? null };
	return {
		invitation: { email: invitation.email, role: invitation.role, projectName: invitation.project.name },
		hasAccount: !!findUserByEmail(invitation.email),
		signedInAs: locals.user?.email ?? null
	};
};

export const actions: Actions = {
	/** A signed-in user with the invited address joins the project. */
	accept: async (event) => {
		const user = requireUser(event);
		const result = await attempt(() => acceptInvitation(event.params.token, user));
		if (!result.ok) return result.failure;
		redirect(303, `/projects/${result.value.project.id}`);
	},
	/** Someone new creates an account for the invited address (receiving the mail proves it), joins and is signed in. */
	register: async (event) => {
		const parsed = await parseForm(event.request, acceptInvitationSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => registerFromInvitation(event.params.token, parsed.data));
		if (!result.ok) return result.failure;
		const { user, invitation } = result.value;
		await signInWith(event, 'credentials', {
			email: user.email,
			password: parsed.data.password,
			redirectTo: `/projects/${invitation.project.id}`
		});
	}
};
