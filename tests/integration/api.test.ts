/**
 * The JSON API and sign-in over HTTP on loopback, against the built server started by tests/setup/server.ts.
 * Roles and the 401/403/404 rule are those of src/lib/server/auth/roles.ts.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, inviteNewAccount, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');

interface ProjectJson {
	id: string;
	name: string;
	role: string;
	lengthUnit: string;
}

async function errorOf(res: Response) {
	const body = (await res.json()) as { error: { code: string; message: string; issues?: unknown[] } };
	return body.error;
}

let owner: HttpSession;
let viewer: HttpSession;
let demoId: string;
/** A project of the owner's for the accounts these tests create, so the demo project stays as seeded. */
let scratchId: string;

beforeAll(async () => {
	owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
	viewer = await signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password);
	const res = await owner.json('GET', '/api/v1/projects');
	const { projects } = (await res.json()) as { projects: ProjectJson[] };
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	const scratch = await owner.json('POST', '/api/v1/projects', { name: 'Account tests' });
	scratchId = ((await scratch.json()) as { project: ProjectJson }).project.id;
});

describe('anonymous and bad credentials', () => {
	it('GET /api/v1/projects without credentials answers 401 in the error shape', async () => {
		const res = await new HttpSession(baseUrl).json('GET', '/api/v1/projects');
		expect(res.status).toBe(401);
		expect(await errorOf(res)).toMatchObject({ code: 'unauthorized' });
	});

	it('a made-up bearer token answers 401 even alongside a valid session cookie', async () => {
		const res = await owner.json('GET', '/api/v1/projects', undefined, { authorization: 'Bearer cf_not-a-real-token' });
		expect(res.status).toBe(401);
		expect((await errorOf(res)).code).toBe('unauthorized');
	});

	it('an unknown API path answers 404 in the error shape', async () => {
		const res = await owner.json('GET', '/api/v1/no-such-thing');
		expect(res.status).toBe(404);
		expect((await errorOf(res)).code).toBe('not_found');
	});

	it('a page needing sign-in redirects anonymous visitors to /signin', async () => {
		const res = await new HttpSession(baseUrl).fetch('/projects');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin\?redirectTo=/);
	});
});

describe('roles on the demo project', () => {
	it('the viewer reads the project and its members', async () => {
		const res = await viewer.json('GET', `/api/v1/projects/${demoId}`);
		expect(res.status).toBe(200);
		expect(((await res.json()) as { project: ProjectJson }).project.role).toBe('viewer');
		const members = await viewer.json('GET', `/api/v1/projects/${demoId}/members`);
		expect(members.status).toBe(200);
		expect(((await members.json()) as { members: unknown[] }).members).toHaveLength(4);
	});

	it('a viewer write answers 403: invite, rename, delete', async () => {
		const invite = await viewer.json('POST', `/api/v1/projects/${demoId}/members`, { email: 'x@example.test', role: 'viewer' });
		expect(invite.status).toBe(403);
		expect((await errorOf(invite)).code).toBe('forbidden');
		expect((await viewer.json('PATCH', `/api/v1/projects/${demoId}`, { name: 'Renamed' })).status).toBe(403);
		expect((await viewer.json('DELETE', `/api/v1/projects/${demoId}`)).status).toBe(403);
	});

	it('an analyst cannot manage members either (owner only)', async () => {
		const analyst = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
		const res = await analyst.json('POST', `/api/v1/projects/${demoId}/members`, { email: 'y@example.test', role: 'viewer' });
		expect(res.status).toBe(403);
	});

	it('a project the user is not a member of answers 404, like one that does not exist', async () => {
		const created = await owner.json('POST', '/api/v1/projects', { name: 'Private site', lengthUnit: 'ft' });
		const { project } = (await created.json()) as { project: ProjectJson };
		expect((await viewer.json('GET', `/api/v1/projects/${project.id}`)).status).toBe(404);
		expect((await viewer.json('GET', `/api/v1/projects/00000000-0000-0000-0000-000000000000`)).status).toBe(404);
		const list = (await (await viewer.json('GET', '/api/v1/projects')).json()) as { projects: ProjectJson[] };
		expect(list.projects.map((p) => p.name)).toEqual([DEMO_PROJECT_NAME]);
	});
});

describe('the owner', () => {
	it('creates, renames, invites to and deletes a project', async () => {
		const created = await owner.json('POST', '/api/v1/projects', { name: 'Quay wall', description: 'Harbour quay', lengthUnit: 'ft' });
		expect(created.status).toBe(201);
		const { project } = (await created.json()) as { project: ProjectJson };
		expect(project).toMatchObject({ name: 'Quay wall', role: 'owner', lengthUnit: 'ft' });

		const renamed = await owner.json('PATCH', `/api/v1/projects/${project.id}`, { name: 'Quay wall north' });
		expect(renamed.status).toBe(200);
		// A rename leaves the other fields alone.
		expect(((await renamed.json()) as { project: ProjectJson }).project).toMatchObject({ name: 'Quay wall north', lengthUnit: 'ft' });

		const invite = await owner.json('POST', `/api/v1/projects/${project.id}/members`, { email: 'New.Person@Example.test', role: 'analyst' });
		expect(invite.status).toBe(201);
		expect(((await invite.json()) as { invitation: { email: string } }).invitation.email).toBe('new.person@example.test');

		const again = await owner.json('POST', `/api/v1/projects/${project.id}/members`, { email: DEMO.owner.email, role: 'viewer' });
		expect(again.status).toBe(409);

		expect((await owner.json('DELETE', `/api/v1/projects/${project.id}`)).status).toBe(204);
		expect((await owner.json('GET', `/api/v1/projects/${project.id}`)).status).toBe(404);
	});

	it('without JavaScript, a refused new-project form comes back with the name, description and unit typed', async () => {
		const name = 'N'.repeat(121);
		const res = await owner.form('/projects/new?/create', { name, description: 'Kept <as> typed', lengthUnit: 'ft' }, 'text/html');
		expect(res.status).toBe(400);
		const page = await res.text();
		expect(page).toMatch(new RegExp(`<input[^>]*name="name"[^>]*value="${name}"`));
		expect(page).toMatch(/<textarea[^>]*name="description"[^>]*>Kept &lt;as> typed<\/textarea>/);
		expect(page).toMatch(/<input[^>]*value="ft"[^>]*checked/);
		expect(page).not.toMatch(/<input[^>]*value="m"[^>]*checked/);
	});

	it('cannot demote or remove the last owner (409)', async () => {
		const members = (await (await owner.json('GET', `/api/v1/projects/${demoId}/members`)).json()) as {
			members: { userId: string; role: string }[];
		};
		const me = members.members.find((m) => m.role === 'owner')!;
		expect((await owner.json('PATCH', `/api/v1/projects/${demoId}/members`, { userId: me.userId, role: 'viewer' })).status).toBe(409);
		expect((await owner.json('DELETE', `/api/v1/projects/${demoId}/members`, { userId: me.userId })).status).toBe(409);
	});

	it('gets 422 with issues for an invalid body and 400 for a body that is not JSON', async () => {
		const invalid = await owner.json('POST', '/api/v1/projects', { name: '', lengthUnit: 'yd' });
		expect(invalid.status).toBe(422);
		const error = await errorOf(invalid);
		expect(error.code).toBe('invalid');
		expect(error.issues?.length).toBe(2);
		const garbage = await owner.fetch('/api/v1/projects', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{oops' });
		expect(garbage.status).toBe(400);
	});

	it('gets 413 for a body over 1 MiB', async () => {
		const res = await owner.json('POST', '/api/v1/projects', { name: 'Big', description: 'x'.repeat(1024 * 1024 + 10) });
		expect(res.status).toBe(413);
		expect((await errorOf(res)).code).toBe('payload_too_large');
	});
});

describe('personal API tokens', () => {
	it('a token acts with its owner’s roles and is refused once revoked', async () => {
		const created = await owner.json('POST', '/api/v1/account/tokens', { name: 'script', expiresInDays: 7 });
		expect(created.status).toBe(201);
		const { token, apiToken } = (await created.json()) as { token: string; apiToken: { id: string } };
		expect(token).toMatch(/^cf_[A-Za-z0-9_-]{43}$/);

		const anon = new HttpSession(baseUrl);
		const bearer = { authorization: `Bearer ${token}` };
		const list = await anon.json('GET', '/api/v1/projects', undefined, bearer);
		expect(list.status).toBe(200);
		expect(((await list.json()) as { projects: ProjectJson[] }).projects.some((p) => p.id === demoId && p.role === 'owner')).toBe(true);

		// The listing never contains the token itself.
		const listing = await owner.json('GET', '/api/v1/account/tokens');
		expect(await listing.text()).not.toContain(token);

		expect((await owner.json('DELETE', `/api/v1/account/tokens/${apiToken.id}`)).status).toBe(204);
		const refused = await anon.json('GET', '/api/v1/projects', undefined, bearer);
		expect(refused.status).toBe(401);
	});

	it('a viewer’s token cannot write (403)', async () => {
		const created = await viewer.json('POST', '/api/v1/account/tokens', { name: 'viewer script', expiresInDays: 30 });
		const { token } = (await created.json()) as { token: string };
		const res = await new HttpSession(baseUrl).json('PATCH', `/api/v1/projects/${demoId}`, { name: 'x' }, { authorization: `Bearer ${token}` });
		expect(res.status).toBe(403);
	});

	it('an expiry outside the offered choices answers 422', async () => {
		const res = await owner.json('POST', '/api/v1/account/tokens', { name: 'odd', expiresInDays: 3 });
		expect(res.status).toBe(422);
	});
});

describe('sign-in', () => {
	it('a wrong password does not sign in', async () => {
		const s = new HttpSession(baseUrl);
		await s.signIn(DEMO.analyst.email, 'wrong-password');
		expect(s.signedIn).toBe(false);
	});

	it('after 5 failures for an account, even the right password is refused with a clear message (429)', async () => {
		const admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
		const email = 'throttled@example.test';
		const password = 'throttled-password';
		await inviteNewAccount(baseUrl, owner, admin, { projectId: scratchId, email, role: 'viewer', password });
		const s = new HttpSession(baseUrl);
		for (let i = 0; i < 5; i++) {
			const res = await s.signIn(email, `wrong-${i}`);
			expect(await res.text()).toContain('E-mail or password is not right.');
		}
		const blocked = await s.signIn(email, password);
		expect(s.signedIn).toBe(false);
		const text = await blocked.text();
		expect(text).toContain('Too many failed sign-in attempts for this account');
		expect(text).toMatch(/Wait 1[45] minutes/);
		// The page without JavaScript shows the same message, with the status of the refusal.
		const html = await s.form('/signin?/password', { email, password }, 'text/html');
		expect(html.status).toBe(429);
		const page = await html.text();
		expect(page).toContain('Too many failed sign-in attempts');
		// ... and the e-mail comes back in its field (rendered from the field's defaultValue).
		expect(page).toMatch(new RegExp(`<input[^>]*name="email"[^>]*value="${email}"`));
		// Other accounts from the same address are unaffected.
		expect((await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password)).signedIn).toBe(true);
	});

	it('a disabled user loses access at the next request, and their sessions stay ended when re-enabled', async () => {
		const admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
		const email = 'to-disable@example.test';
		const password = 'to-disable-password';
		const member = await inviteNewAccount(baseUrl, owner, admin, { projectId: scratchId, email, role: 'analyst', password });
		const members = (await (await owner.json('GET', `/api/v1/projects/${scratchId}/members`)).json()) as {
			members: { userId: string; email: string }[];
		};
		const userId = members.members.find((m) => m.email === email)!.userId;
		expect((await member.json('GET', '/api/v1/projects')).status).toBe(200);

		await admin.form('/admin/users?/disable', { userId, disabled: 'true' });
		expect((await member.json('GET', '/api/v1/projects')).status).toBe(401);
		const again = new HttpSession(baseUrl);
		expect(await (await again.signIn(email, password)).text()).toContain('disabled');
		expect(again.signedIn).toBe(false);

		await admin.form('/admin/users?/disable', { userId, disabled: 'false' });
		expect((await member.json('GET', '/api/v1/projects')).status).toBe(401);
		expect((await signedInSession(baseUrl, email, password)).signedIn).toBe(true);
	});

	it('only site admins reach the admin pages (403 for a member)', async () => {
		expect((await owner.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).status).toBe(403);
		const admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
		expect((await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).status).toBe(200);
	});
});

describe('password reset by an administrator', () => {
	it('the reset link arrives in the outbox, sets a new password once, and the old one stops working', async () => {
		const admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
		const email = 'forgetful@example.test';
		const password = 'forgetful-password';
		await inviteNewAccount(baseUrl, owner, admin, { projectId: scratchId, email, role: 'viewer', password });
		const members = (await (await owner.json('GET', `/api/v1/projects/${scratchId}/members`)).json()) as {
			members: { userId: string; email: string }[];
		};
		const userId = members.members.find((m) => m.email === email)!.userId;

		const sent = await admin.form('/admin/users?/reset', { userId }, 'text/html');
		expect(await sent.text()).toContain(`A password-reset link was sent to ${email}`);

		const outbox = await (await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).text();
		expect(outbox).toContain('Reset your Conefield password');
		const link = new URL(/href="([^"]*\/reset-password\/[^"]+)"/.exec(outbox)![1]);
		expect(link.origin).toBe(baseUrl);

		const anon = new HttpSession(baseUrl);
		const short = await anon.form(link.pathname, { password: 'short', confirm: 'short' }, 'text/html');
		expect(short.status).toBe(400);
		expect(await short.text()).toContain('Use at least 10 characters.');

		const done = await anon.form(link.pathname, { password: 'viewer-new-password', confirm: 'viewer-new-password' });
		expect(await done.text()).toContain('/signin?reset=1');
		expect((await signedInSession(baseUrl, email, 'viewer-new-password')).signedIn).toBe(true);
		const old = new HttpSession(baseUrl);
		await old.signIn(email, password);
		expect(old.signedIn).toBe(false);

		const reused = await anon.form(link.pathname, { password: 'another-password-1', confirm: 'another-password-1' }, 'text/html');
		expect(reused.status).toBe(409);
		expect(await reused.text()).toContain('already used');
	});
});
