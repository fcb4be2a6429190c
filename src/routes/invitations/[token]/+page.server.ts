import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signInWith } from '$lib/server/auth';
import { requireUser } from '$lib/server/auth/guard';
import { attempt, formFailure, parseForm } from '$lib/server/forms';
import { acceptInvitation, findInvitation } from '$lib/server/services/members';
import { createUser, findUserByEmail } from '$lib/server/services/users';
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
		const invitation = findInvitation(event.params.token);
		if (!invitation) return formFailure(404, 'This invitation has expired or was already used.');
		const parsed = await parseForm(event.request, acceptInvitationSchema);
		if (!parsed.ok) return parsed.failure;
		const created = await attempt(() =>
			createUser({ email: invitation.email, name: parsed.data.name, password: parsed.data.password, emailVerified: true })
		);
		if (!created.ok) return created.failure;
		acceptInvitation(event.params.token, created.value);
		await signInWith(event, 'credentials', {
			email: invitation.email,
			password: parsed.data.password,
			redirectTo: `/projects/${invitation.project.id}`
		});
	}
};
