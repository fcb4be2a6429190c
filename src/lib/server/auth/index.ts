import { SvelteKitAuth, AuthError, CredentialsSignin, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { isRedirect, type RequestEvent } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { accounts, sessions, users, verificationTokens, type SiteRole } from '$lib/server/db/schema';
import { actionMail, sendMail } from '$lib/server/mail';
import { inBackground } from '$lib/server/background';
import { safeRedirectPath } from '$lib/redirect';
import { signInSchema } from '$lib/schemas';
import { clientAddress, clientUserAgent } from './context';
import { dummyHash, verifyPassword } from './password';
import { resolveAuthSecret } from './secret';
import { checkSession, createSession, revokeSession, SESSION_IDLE_SECONDS } from './sessions';
import { checkThrottle, recordAttempt } from './throttle';

/** Raised by `authorize` so the sign-in page can say why; the code travels in the redirect URL. */
export class ThrottledSignIn extends CredentialsSignin {
	code = 'throttled';
}
export class DisabledSignIn extends CredentialsSignin {
	code = 'disabled';
}

declare module '@auth/sveltekit' {
	interface Session {
		user: { id: string; siteRole: SiteRole; email: string; name?: string | null };
		/** The server-side session this JWT names (src/lib/server/auth/sessions.ts). */
		sessionId: string;
	}
}

function config(): SvelteKitAuthConfig {
	const db = getDb();
	return {
		secret: resolveAuthSecret(),
		trustHost: true,
		basePath: '/auth',
		// Credentials sign-in only works with JWT sessions; each JWT names a row of the sessions table.
		session: { strategy: 'jwt', maxAge: SESSION_IDLE_SECONDS },
		adapter: {
			...DrizzleAdapter(db, {
				usersTable: users,
				accountsTable: accounts,
				sessionsTable: sessions,
				verificationTokensTable: verificationTokens
			} as never), // our tables carry more columns than the adapter's declared defaults
			// An e-mail sign-in link is claimed by one DELETE … RETURNING in a transaction: of concurrent uses, one wins.
			useVerificationToken: async ({ identifier, token }) =>
				db.transaction((tx) =>
					tx
						.delete(verificationTokens)
						.where(and(eq(verificationTokens.identifier, identifier), eq(verificationTokens.token, token)))
						.returning()
						.get()
				) ?? null
		},
		pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/check-email' },
		providers: [
			Credentials({
				credentials: { email: { type: 'email' }, password: { type: 'password' } },
				async authorize(raw) {
					const parsed = signInSchema.safeParse(raw);
					if (!parsed.success) return null;
					const { email, password } = parsed.data;
					const address = clientAddress();
					if (checkThrottle(db, email, address).blocked) throw new ThrottledSignIn();
					const user = db.select().from(users).where(eq(users.email, email)).get();
					const ok = await verifyPassword(password, user?.passwordHash ?? (await dummyHash()));
					recordAttempt(db, email, address, ok && !!user);
					if (!user || !ok) return null;
					if (user.disabled) throw new DisabledSignIn();
					return { id: user.id, email: user.email, name: user.name, siteRole: user.siteRole };
				}
			}),
			Nodemailer({
				server: process.env.SMTP_URL || 'smtp://127.0.0.1:25',
				maxAge: 30 * 60,
				async sendVerificationRequest({ identifier, url }) {
					await sendMail(
						actionMail(
							identifier,
							'Your Conefield sign-in link',
							['Someone (hopefully you) asked to sign in to Conefield with this address.', 'The link works once, for 30 minutes.'],
							{ label: 'Sign in to Conefield', url }
						)
					);
				}
			})
		],
		callbacks: {
			// Redirects after sign-in stay on this site, whatever `redirectTo` said.
			redirect({ url, baseUrl }) {
				const target = url.startsWith(baseUrl) ? url.slice(baseUrl.length) || '/' : url;
				return `${baseUrl}${safeRedirectPath(target)}`;
			},
			// Only existing, enabled accounts may sign in by e-mail link; no self-registration.
			async signIn({ user, account }) {
				if (account?.type !== 'email') return true;
				const row = user.email ? db.select().from(users).where(eq(users.email, user.email.toLowerCase())).get() : undefined;
				return !!row && !row.disabled;
			},
			/**
			 * At sign-in, opens a server-side session and writes its id into the JWT. On every later read
			 * (each request, through `locals.auth()`), a JWT whose session was revoked or has expired — or
			 * that names none, as JWTs from before sessions did — is refused: returning null clears the cookie.
			 */
			jwt({ token, user }) {
				if (user) {
					token.sub = user.id;
					token.siteRole = (user as { siteRole?: SiteRole }).siteRole ?? 'member';
					token.sid = createSession(user.id!, { userAgent: clientUserAgent(), address: clientAddress() });
					return token;
				}
				const session = checkSession(token.sid as string | undefined);
				if (!session || session.userId !== token.sub) return null;
				return token;
			},
			session({ session, token }) {
				session.user.id = token.sub ?? '';
				session.user.siteRole = (token.siteRole as SiteRole | undefined) ?? 'member';
				session.sessionId = (token.sid as string | undefined) ?? '';
				return session;
			}
		},
		events: {
			// Sign-out ends the server-side session, so a copy of the cookie stops working too.
			signOut(message) {
				const sid = 'token' in message ? message.token?.sid : undefined;
				if (typeof sid === 'string') revokeSession(sid);
			}
		},
		logger: {
			// Auth.js's own CSRF token is off because SvelteKit checks the Origin of every form post.
			warn(code) {
				if (code !== 'csrf-disabled') console.warn('[auth]', code);
			},
			error(err) {
				// Wrong passwords and refused links are expected; they are not server errors.
				if (err.name === 'CredentialsSignin' || err.name === 'AccessDenied' || err.name === 'Verification') return;
				console.error('[auth]', err);
			}
		}
	};
}

let cached: SvelteKitAuthConfig | undefined;
/** The Auth.js configuration, built once (this resolves AUTH_SECRET, warning when it had to generate one). */
export function authConfig(): SvelteKitAuthConfig {
	cached ??= config();
	return cached;
}
export const auth = SvelteKitAuth(async () => authConfig());

/**
 * Runs an Auth.js sign-in from a form action with fields we choose (the action has already read and
 * validated the form). On success it throws SvelteKit's redirect; on refusal it throws an AuthError.
 */
export async function signInWith(
	event: RequestEvent,
	provider: 'credentials' | 'nodemailer',
	fields: Record<string, string>
): Promise<void> {
	const body = new FormData();
	body.set('providerId', provider);
	for (const [k, v] of Object.entries(fields)) body.set(k, v);
	const headers = new Headers(event.request.headers);
	headers.delete('content-type');
	headers.delete('content-length');
	const request = new Request(event.request.url, { method: 'POST', headers, body });
	await auth.signIn({ request, url: event.url, cookies: event.cookies } as unknown as RequestEvent);
}

/**
 * Asks Auth.js for an e-mail sign-in link after the response has gone: it mails one to an enabled account and
 * refuses any other address, and neither the answer nor its timing may tell which happened.
 */
export function requestSignInLink(event: RequestEvent, email: string, redirectTo: string): void {
	const headers = new Headers(event.request.headers);
	headers.delete('content-type');
	headers.delete('content-length');
	const detached = { request: new Request(event.request.url, { method: 'POST', headers }), url: new URL(event.url), cookies: { set() {}, delete() {} } };
	inBackground('sign-in link', async () => {
		try {
			await signInWith(detached as unknown as RequestEvent, 'nodemailer', { email, redirectTo });
		} catch (err) {
			// Auth.js answers a known address with a redirect and refuses an unknown or disabled one (AccessDenied).
			if (isRedirect(err) || (err instanceof AuthError && err.type === 'AccessDenied')) return;
			throw err;
		}
	});
}

export async function signOutFrom(event: RequestEvent, redirectTo = '/signin'): Promise<void> {
	const body = new FormData();
	body.set('redirectTo', redirectTo);
	const headers = new Headers(event.request.headers);
	headers.delete('content-type');
	headers.delete('content-length');
	const request = new Request(event.request.url, { method: 'POST', headers, body });
	await auth.signOut({ request, url: event.url, cookies: event.cookies } as unknown as RequestEvent);
}

export { CredentialsSignin };
