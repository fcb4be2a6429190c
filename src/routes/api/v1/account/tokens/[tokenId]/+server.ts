import { endpoint } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/guard';
import { revokeApiToken } from '$lib/server/services/tokens';

/** Revokes one of the caller's tokens. */
export const DELETE = endpoint((event) => {
	const user = requireUser(event);
	revokeApiToken(user.id, event.params.tokenId);
	return new Response(null, { status: 204 });
});
