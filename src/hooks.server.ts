import { redirect, type Handle, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { getDb } from '$lib/server/db';
import { auth, authConfig } from '$lib/server/auth';
import { requestContext } from '$lib/server/auth/context';
import { closeMail, getTransport } from '$lib/server/mail';
import { seedDemo } from '$lib/server/services/demo';
import { findUser } from '$lib/server/services/users';
import { userForApiToken } from '$lib/server/services/tokens';
import { apiError } from '$lib/server/api';

/** Opens and migrates the database, seeds the demo into an empty one, and starts mail, before the first request. */
export const init: ServerInit = async () => {
	if (building) return;
	const db = getDb();
	const seeded = await seedDemo(db);
	if (seeded) console.info('[conefield] empty database: seeded the demo accounts and project (see README).');
	authConfig();
	await getTransport();
	// adapter-node emits this after closing the HTTP server; the SMTP sink would otherwise keep the process alive.
	process.once('sveltekit:shutdown' as 'beforeExit', () => {
		void closeMail().then(() => db.$client.close());
	});
};

const context: Handle = ({ event, resolve }) =>
	requestContext.run({ address: event.getClientAddress() }, () => resolve(event));

/**
 * Who is asking. On /api/v1 an `Authorization: Bearer` header, when present, is the only credential
 * considered (a bad token is a 401 even with a session cookie). Otherwise the Auth.js session, re-checked
 * against the database on every request so a disabled user loses access at once.
 */
const identify: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.authVia = null;
	const isApi = event.url.pathname.startsWith('/api/');
	const header = event.request.headers.get('authorization');
	if (isApi && header) {
		const match = /^Bearer\s+(\S+)$/i.exec(header);
		const owner = match ? userForApiToken(match[1]) : undefined;
		if (!owner) return apiError(401, 'The API token is missing, unknown, expired or revoked.');
		event.locals.user = { id: owner.id, email: owner.email, name: owner.name, siteRole: owner.siteRole };
		event.locals.authVia = 'token';
		return resolve(event);
	}
	const session = await event.locals.auth();
	const row = session?.user?.id ? findUser(session.user.id) : undefined;
	if (row && !row.disabled) {
		event.locals.user = { id: row.id, email: row.email, name: row.name, siteRole: row.siteRole };
		event.locals.authVia = 'session';
	}
	return resolve(event);
};

const PUBLIC_PREFIXES = ['/signin', '/auth/', '/invitations/', '/reset-password/', '/api/'];

/** Pages need a signed-in user; API routes answer 401 themselves through the authorization helper. */
const guard: Handle = ({ event, resolve }) => {
	const path = event.url.pathname;
	const isPublic = path === '/' || PUBLIC_PREFIXES.some((p) => path.startsWith(p));
	if (!event.locals.user && !isPublic && event.route.id) {
		redirect(303, `/signin?redirectTo=${encodeURIComponent(path + event.url.search)}`);
	}
	return resolve(event);
};

export const handle = sequence(context, auth.handle, identify, guard);
