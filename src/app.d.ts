// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SiteRole } from '$lib/server/db/schema';

declare global {
	namespace App {
		interface Error {
			message: string;
		}
		interface Locals {
			/** The signed-in, enabled user (from the session cookie or an API token), or null. */
			user: { id: string; email: string; name: string | null; siteRole: SiteRole } | null;
			/** How the user was identified. */
			authVia: 'session' | 'token' | null;
			/** The server-side session of a cookie-authenticated request (null for tokens and anonymous requests). */
			sessionId: string | null;
		}
	}
}

export {};
