/**
 * A tiny HTTP client with a cookie jar, for tests against the running server.
 * `signIn` posts the real sign-in form (the same action the page uses) and keeps the session cookie.
 */
export class HttpSession {
	readonly cookies = new Map<string, string>();

	constructor(readonly baseUrl: string) {}

	cookieHeader(): string {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}

	private keep(res: Response): void {
		for (const line of res.headers.getSetCookie()) {
			const [pair, ...attrs] = line.split(';');
			const eq = pair.indexOf('=');
			const name = pair.slice(0, eq).trim();
			const value = pair.slice(eq + 1).trim();
			const expired = attrs.some((a) => /^\s*max-age=0\s*$/i.test(a));
			if (expired || value === '') this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	/** fetch relative to the base URL, with the jar's cookies and the Origin SvelteKit requires for form posts. */
	async fetch(path: string, init: RequestInit = {}): Promise<Response> {
		const headers = new Headers(init.headers);
		if (this.cookies.size > 0 && !headers.has('cookie')) headers.set('cookie', this.cookieHeader());
		if (!headers.has('origin')) headers.set('origin', this.baseUrl);
		const res = await fetch(new URL(path, this.baseUrl), { redirect: 'manual', ...init, headers });
		this.keep(res);
		return res;
	}

	/** JSON request helper: sends `body` as JSON when given. */
	json(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
		return this.fetch(path, {
			method,
			headers: { accept: 'application/json', ...(body === undefined ? {} : { 'content-type': 'application/json' }), ...headers },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
	}

	/** Posts a form (urlencoded) to a page action, e.g. `/projects/new?/create`. */
	form(path: string, fields: Record<string, string>, accept = 'application/json'): Promise<Response> {
		return this.fetch(path, {
			method: 'POST',
			headers: { 'content-type': 'application/x-www-form-urlencoded', accept },
			body: new URLSearchParams(fields).toString()
		});
	}

	get signedIn(): boolean {
		return [...this.cookies.keys()].some((k) => k.endsWith('authjs.session-token'));
	}

	/** Signs in with e-mail and password through the sign-in page's action; returns the response. */
	async signIn(email: string, password: string): Promise<Response> {
		return this.form('/signin?/password', { email, password, redirectTo: '/projects' });
	}
}

/** A new session signed in as the given account; throws when sign-in fails. */
export async function signedInSession(baseUrl: string, email: string, password: string): Promise<HttpSession> {
	const session = new HttpSession(baseUrl);
	const res = await session.signIn(email, password);
	if (!session.signedIn) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
	return session;
}

/**
 * A brand-new account, made the way a colleague joins: `inviter` (an owner session) invites `email` to
 * `projectId` with `role`, the site admin reads the invitation in the outbox, and the newcomer registers
 * through the accept page. Returns the newcomer's signed-in session. Use it for tests that change an
 * account (password, throttling, disabling) so the shared demo accounts stay usable.
 */
export async function inviteNewAccount(
	baseUrl: string,
	inviter: HttpSession,
	admin: HttpSession,
	{ projectId, email, role, password }: { projectId: string; email: string; role: string; password: string }
): Promise<HttpSession> {
	const invited = await inviter.json('POST', `/api/v1/projects/${projectId}/members`, { email, role });
	if (invited.status !== 201) throw new Error(`invite failed: ${invited.status} ${await invited.text()}`);
	const outbox = await (await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).text();
	const match = /href="[^"]*(\/invitations\/[^"]+)"/.exec(outbox);
	if (!match) throw new Error('no invitation link in the outbox');
	const newcomer = new HttpSession(baseUrl);
	await newcomer.form(`${match[1]}?/register`, { name: email.split('@')[0], password, confirm: password });
	if (!newcomer.signedIn) throw new Error(`registering ${email} did not sign in`);
	return newcomer;
}
