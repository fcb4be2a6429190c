import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/guard';
import { createApiToken, listApiTokens } from '$lib/server/services/tokens';
import { apiTokenCreateSchema } from '$lib/schemas';

export const GET = endpoint((event) => {
	const user = requireUser(event);
	return json({ tokens: listApiTokens(user.id) });
});

/** Creates a personal API token; the response is the only time the token itself is shown. */
export const POST = endpoint(async (event) => {
	const user = requireUser(event);
	const { name, expiresInDays } = await parseJson(event.request, apiTokenCreateSchema);
	const { token, view } = createApiToken(user.id, name, expiresInDays);
	return json({ token, apiToken: view }, { status: 201 });
});
