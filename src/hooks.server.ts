import { redirect, type Handle, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { getDb } from '$lib/server/db';
import { auth, authConfig } from '$lib/server/auth';
import { requestContext } from '$lib/server/auth/context';
import { closeMail, getTransport } from '$lib/server/mail';
import { settleBackground } from '$lib/server/background';
import { seedDemo } from '$lib/server/services/demo';
import { stopRealizations } from '$lib/server/realizations';
import { resumeExports, stopExports } from '$lib/server/services/export-jobs';
import { stopMeshWorker } from '$lib/server/services/mesh-thread';
import { startQueue, stopQueue } from '$lib/server/queue';
import { ensureInitialAdmin, findUser } from '$lib/server/services/users';
import { initialAdminEmail, seedDemoEnabled } from '$lib/server/config';
import { crossSiteRefusal, refuseUnread } from '$lib/server/csrf';
import { userForApiToken } from '$lib/server/services/tokens';
import { apiError } from '$lib/server/api';
import { asActor } from '$lib/server/services/audit';

/**
 * Opens and migrates the database, starts mail, seeds the demo into an empty database when SEED_DEMO is on,
 * and creates the first administrator named by ADMIN_EMAIL, before the first request.
 */
export const init: ServerInit = async () => {
	if (building) return;
	const db = getDb();
	authConfig();
	await getTransport();
	if (seedDemoEnabled()) {
		const seeded = await seedDemo(db);
		if (seeded) console.info('[conefield] empty database: seeded the demo accounts and project (SEED_DEMO is on; see README).');
	}
	const adminEmail = initialAdminEmail();
	if (adminEmail) await ensureInitialAdmin(adminEmail, process.env.ORIGIN ?? `http://localhost:${process.env.PORT ?? 3000}`);
	// Before the export jobs resume: with REDIS_URL they run on the queue's runner.
	startQueue();
	resumeExports(db);
	// adapter-node emits this after closing the HTTP server; the SMTP sink and the realization workers would
	// otherwise keep the process alive.
	process.once('sveltekit:shutdown' as 'beforeExit', () => {
		void settleBackground()
			.then(() => stopExports())
			.then(() => Promise.all([closeMail(), stopRealizations(), stopMeshWorker(), stopQueue()]))
			.then(() => db.$client.close());
	});
};

const context: Handle = ({ event, resolve }) =>
	requestContext.run({ address: event.getClientAddress(), userAgent: event.request.headers.get('user-agent') }, () => resolve(event));

/** Refuses cross-site form posts of cookie sessions (see src/lib/server/csrf.ts); the framework's own check is off. */
const csrf: Handle = async ({ event, resolve }) => {
	const refusal = crossSiteRefusal(event.request, event.url);
	return refusal ? refuseUnread(event.request, refusal) : resolve(event);
};

/**
 * Who is asking. On /api/v1 an `Authorization: Bearer` header, when present, is the only credential
 * considered (a bad token is a 401 even with a session cookie). Otherwise the Auth.js session: its JWT must
 * name an active server-side session (checked, and touched at most once a minute, in the jwt callback that
 * `locals.auth()` runs) and its user must still be enabled, so sign-out, password changes, disabling and
 * ended sessions take effect at the next request. The rest of the request acts for that user (asActor): the
 * audit log names them for the changes it makes.
 */
const identify: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.authVia = null;
	event.locals.sessionId = null;
	const isApi = event.url.pathname.startsWith('/api/');
	const header = event.request.headers.get('authorization');
	if (isApi && header) {
		const match = /^Bearer\s+(\S+)$/i.exec(header);
		const owner = match ? userForApiToken(match[1]) : undefined;
		if (!owner) return refuseUnread(event.request, apiError(401, 'The API token is missing, unknown, expired or revoked.'));
		event.locals.user = { id: owner.id, email: owner.email, name: owner.name, siteRole: owner.siteRole };
		event.locals.authVia = 'token';
		return asActor(owner.id, () => resolve(event));
	}
	const session = await event.locals.auth();
	const row = session?.user?.id ? findUser(session.user.id) : undefined;
	if (row && !row.disabled) {
		event.locals.user = { id: row.id, email: row.email, name: row.name, siteRole: row.siteRole };
		event.locals.authVia = 'session';
		event.locals.sessionId = session!.sessionId;
	}
	return asActor(event.locals.user?.id ?? null, () => resolve(event));
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

export const handle = sequence(context, csrf, auth.handle, identify, guard);
