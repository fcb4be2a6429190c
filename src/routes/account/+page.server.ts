import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireUser } from '$lib/server/auth/guard';
import { listSessions, revokeOwnSession, revokeUserSessions } from '$lib/server/auth/sessions';
import { attempt, parseForm } from '$lib/server/forms';
import { changePassword } from '$lib/server/services/users';
import { createApiToken, listApiTokens, revokeApiToken } from '$lib/server/services/tokens';
import { apiTokenCreateSchema, apiTokenRevokeSchema, changePasswordSchema, TOKEN_LIFETIMES_DAYS } from '$lib/schemas';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	return {
		tokens: listApiTokens(user.id),
		lifetimes: TOKEN_LIFETIMES_DAYS,
		sessions: listSessions(user.id, event.locals.sessionId)
	};
};

export const actions: Actions = {
	password: async (event) => {
		const user = requireUser(event);
		const parsed = await parseForm(event.request, changePasswordSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => changePassword(user.id, parsed.data.current, parsed.data.password, event.locals.sessionId));
		return result.ok ? { passwordChanged: true } : result.failure;
	},
	createToken: async (event) => {
		const user = requireUser(event);
		const parsed = await parseForm(event.request, apiTokenCreateSchema);
		if (!parsed.ok) return parsed.failure;
		const { token, view } = createApiToken(user.id, parsed.data.name, parsed.data.expiresInDays);
		// The plain token leaves the server this once.
		return { createdToken: { token, name: view.name, expiresAt: view.expiresAt } };
	},
	revokeToken: async (event) => {
		const user = requireUser(event);
		const parsed = await parseForm(event.request, apiTokenRevokeSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => revokeApiToken(user.id, parsed.data.id));
		return result.ok ? { revoked: parsed.data.id } : result.failure;
	},
	endSession: async (event) => {
		const user = requireUser(event);
		const parsed = await parseForm(event.request, z.object({ id: z.string().min(1) }));
		if (!parsed.ok) return parsed.failure;
		const result = await attempt(() => revokeOwnSession(user.id, parsed.data.id));
		return result.ok ? { sessionsEnded: 1 } : result.failure;
	},
	endOtherSessions: async (event) => {
		const user = requireUser(event);
		return { sessionsEnded: revokeUserSessions(user.id, { except: event.locals.sessionId }) };
	}
};
