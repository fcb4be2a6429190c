/**
 * Sessions end (issue 11, High 1): a session cookie copied before sign-out, a password reset, disabling or
 * "sign out everywhere else" is refused afterwards — 401 on the API, a redirect to sign-in on pages — because
 * every JWT names a server-side session that those events revoke.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { encode } from '@auth/core/jwt';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, HttpSession, signedInSession } from '../setup';
import { freshAccount, mailLink, scratchProject, stolenCookie } from '../setup/accounts';

const baseUrl = inject('baseUrl');
let projectId: string;
let admin: HttpSession;

beforeAll(async () => {
	projectId = await scratchProject(baseUrl, 'Session tests');
	admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
});

/** Expects the stolen cookie to be refused everywhere: 401 on the API, a redirect to /signin for /account. */
async function expectRefused(stolen: ReturnType<typeof stolenCookie>) {
	expect(await stolen.api()).toBe(401);
	const page = await stolen.account();
	expect(page.status).toBe(303);
	expect(page.location).toMatch(/^\/signin\?redirectTo=%2Faccount/);
}

describe('a session cookie stops working', () => {
	it('after sign-out, even when copied before', async () => {
		const { session } = await freshAccount(baseUrl, projectId, 'signout');
		const stolen = stolenCookie(session);
		expect(await stolen.api()).toBe(200);
		expect((await stolen.account()).status).toBe(200);
		const out = await session.form('/signout', {}, 'text/html');
		expect([302, 303]).toContain(out.status);
		expect(out.headers.get('location')).toMatch(/\/signin$/);
		expect(session.signedIn).toBe(false);
		await expectRefused(stolen);
	});

	it('after an administrator’s password reset is used', async () => {
		const account = await freshAccount(baseUrl, projectId, 'reset');
		const stolen = stolenCookie(account.session);
		await admin.form('/admin/users?/reset', { userId: account.userId }, 'text/html');
		// Sending the link alone does not end the session; choosing the new password does.
		expect(await stolen.api()).toBe(200);
		const link = new URL(await mailLink(admin, account.email, '/reset-password/'));
		const done = await new HttpSession(baseUrl).form(link.pathname, { password: 'brand-new-password', confirm: 'brand-new-password' });
		expect(await done.text()).toContain('/signin?reset=1');
		await expectRefused(stolen);
		expect((await signedInSession(baseUrl, account.email, 'brand-new-password')).signedIn).toBe(true);
	});

	it('after the user is disabled, and still after they are enabled again', async () => {
		const account = await freshAccount(baseUrl, projectId, 'disabled');
		const stolen = stolenCookie(account.session);
		await admin.form('/admin/users?/disable', { userId: account.userId, disabled: 'true' });
		await expectRefused(stolen);
		await admin.form('/admin/users?/disable', { userId: account.userId, disabled: 'false' });
		await expectRefused(stolen);
		expect((await signedInSession(baseUrl, account.email, account.password)).signedIn).toBe(true);
	});

	it('after “sign out everywhere else” from another browser; the browser that asked stays signed in', async () => {
		const account = await freshAccount(baseUrl, projectId, 'others');
		const laptop = await signedInSession(baseUrl, account.email, account.password);
		const stolen = stolenCookie(account.session);
		const ended = await laptop.form('/account?/endOtherSessions', {});
		expect(ended.status).toBe(200);
		await expectRefused(stolen);
		expect((await laptop.json('GET', '/api/v1/projects')).status).toBe(200);
	});

	it('after the user changes their password (other sessions end, this one stays)', async () => {
		const account = await freshAccount(baseUrl, projectId, 'change');
		const other = await signedInSession(baseUrl, account.email, account.password);
		const stolen = stolenCookie(other);
		const res = await account.session.form('/account?/password', { current: account.password, password: 'changed-password-1', confirm: 'changed-password-1' });
		expect(res.status).toBe(200);
		await expectRefused(stolen);
		expect((await account.session.json('GET', '/api/v1/projects')).status).toBe(200);
	});

	it('when its JWT names no server-side session (as before sessions existed), even though it is validly signed', async () => {
		const account = await freshAccount(baseUrl, projectId, 'legacy');
		const secret = readFileSync(join(inject('dataDir'), 'auth-secret'), 'utf8').trim();
		const salt = 'authjs.session-token';
		const token = await encode({ secret, salt, token: { sub: account.userId, email: account.email, siteRole: 'member' } });
		const forged = new HttpSession(baseUrl);
		forged.cookies.set(salt, token);
		expect((await forged.json('GET', '/api/v1/projects')).status).toBe(401);
		// The same encoding with the session id of a live session is accepted, so the refusal above is about the id.
		const sid = await sessionIdOf(account.session);
		const valid = await encode({ secret, salt, token: { sub: account.userId, email: account.email, siteRole: 'member', sid } });
		const alive = new HttpSession(baseUrl);
		alive.cookies.set(salt, valid);
		expect((await alive.json('GET', '/api/v1/projects')).status).toBe(200);
	});
});

/** The id of a session, as its own account page shows it. */
async function sessionIdOf(session: HttpSession): Promise<string> {
	const html = await (await session.fetch('/account', { headers: { accept: 'text/html' } })).text();
	return /data-session="([^"]+)" data-current="true"/.exec(html)![1];
}

describe('the account page’s session list', () => {
	it('lists each active session with its device, marks this one, and ends one by id', async () => {
		const account = await freshAccount(baseUrl, projectId, 'listing');
		const phone = new HttpSession(baseUrl);
		await phone.fetch('/signin?/password', {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				'user-agent': 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1'
			},
			body: new URLSearchParams({ email: account.email, password: account.password, redirectTo: '/projects' }).toString()
		});
		expect(phone.signedIn).toBe(true);
		const html = await (await account.session.fetch('/account', { headers: { accept: 'text/html' } })).text();
		expect(html).toContain('Where you are signed in');
		expect(html).toContain('Safari 17 on iOS');
		expect(html).toContain('this browser');
		const others = [...html.matchAll(/data-session="([^"]+)" data-current="false"/g)].map((m) => m[1]);
		expect(others).toHaveLength(1);
		const phoneId = others[0];
		expect((await phone.json('GET', '/api/v1/projects')).status).toBe(200);
		await account.session.form('/account?/endSession', { id: phoneId });
		expect((await phone.json('GET', '/api/v1/projects')).status).toBe(401);
	});

	it('cannot end another user’s session (404), which keeps working', async () => {
		const victim = await freshAccount(baseUrl, projectId, 'victim');
		const attacker = await freshAccount(baseUrl, projectId, 'attacker');
		const victimId = await sessionIdOf(victim.session);
		const res = await attacker.session.form('/account?/endSession', { id: victimId }, 'text/html');
		expect(res.status).toBe(404);
		expect((await victim.session.json('GET', '/api/v1/projects')).status).toBe(200);
	});
});
