import type { Actions, PageServerLoad } from './$types';
import { z } from 'zod';
import { requireAdmin } from '$lib/server/auth/guard';
import { attempt, parseForm } from '$lib/server/forms';
import { findUser, listUsers, sendPasswordReset, setDisabled } from '$lib/server/services/users';

const target = z.object({ userId: z.string().min(1) });

export const load: PageServerLoad = (event) => {
	requireAdmin(event);
	return { users: listUsers() };
};

export const actions: Actions = {
	disable: async (event) => {
		const admin = requireAdmin(event);
		const parsed = await parseForm(event.request, target.extend({ disabled: z.enum(['true', 'false']) }));
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => setDisabled(admin.id, parsed.data.userId, parsed.data.disabled === 'true'));
		return result.ok ? {} : result.failure;
	},
	reset: async (event) => {
		requireAdmin(event);
		const parsed = await parseForm(event.request, target);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => sendPasswordReset(parsed.data.userId, event.url.origin));
		return result.ok ? { resetSentTo: findUser(parsed.data.userId)?.email ?? '' } : result.failure;
	}
};
