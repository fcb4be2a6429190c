/**
 * Helpers for the security tests: reading a link from the newest outbox message to an address, finding a
 * user's id, and making a fresh account through the invitation flow.
 */
import { DEMO } from './demo';
import { HttpSession, inviteNewAccount, signedInSession } from './http';

/**
 * The first link containing `pathPart` in the newest outbox message to `to`, read as the site admin. Polls
 * for a few seconds, since some mail (sign-in links) is sent in the background after the response.
 */
export async function mailLink(admin: HttpSession, to: string, pathPart: string, timeoutMs = 5000): Promise<string> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const html = await (await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).text();
		const open = /<article[^>]*data-testid="outbox-message"[^]*?<\/article>/.exec(html)?.[0] ?? '';
		const link = new RegExp(`href="([^"]*${pathPart.replace(/[/.]/g, '\\$&')}[^"]*)"`).exec(open)?.[1];
		if (open.includes(`<dd>${to}</dd>`) && link) return link.replaceAll('&amp;', '&');
		if (Date.now() > deadline) throw new Error(`no ${pathPart} link in the newest mail to ${to}`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

export interface FreshAccount {
	email: string;
	password: string;
	userId: string;
	session: HttpSession;
}

/**
 * A new account (so tests that end sessions, disable or reset leave the demo accounts alone): invited by the
 * demo owner to `projectId` as analyst, registered through the invitation, signed in.
 */
export async function freshAccount(baseUrl: string, projectId: string, label: string): Promise<FreshAccount> {
	const owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
	const admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
	const email = `${label}-${crypto.randomUUID().slice(0, 8)}@example.test`;
	const password = `${label}-password-1`;
	const session = await inviteNewAccount(baseUrl, owner, admin, { projectId, email, role: 'analyst', password });
	const members = (await (await owner.json('GET', `/api/v1/projects/${projectId}/members`)).json()) as {
		members: { userId: string; email: string }[];
	};
	return { email, password, userId: members.members.find((m) => m.email === email)!.userId, session };
}

/** A project of the demo owner's for accounts the tests create. */
export async function scratchProject(baseUrl: string, name: string): Promise<string> {
	const owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
	const res = await owner.json('POST', '/api/v1/projects', { name });
	return ((await res.json()) as { project: { id: string } }).project.id;
}

/**
 * What someone who copied a session's cookie holds: it sends exactly that cookie every time, whatever the
 * server answers (a browser would drop a cleared cookie; an attacker would not).
 */
export function stolenCookie(session: HttpSession) {
	const cookie = session.cookieHeader();
	const get = (path: string, accept = 'application/json') =>
		fetch(new URL(path, session.baseUrl), { redirect: 'manual', headers: { cookie, accept } });
	return {
		/** Status of GET /api/v1/projects with the cookie. */
		api: async () => (await get('/api/v1/projects')).status,
		/** Status and location of GET /account with the cookie. */
		account: async () => {
			const res = await get('/account', 'text/html');
			return { status: res.status, location: res.headers.get('location') };
		}
	};
}
