/**
 * Single-use links under concurrency (issue 11, High 2 and Low 7): of 8 simultaneous uses of one
 * password-reset link, invitation or e-mail sign-in link, exactly one succeeds and the others are refused
 * with a clear status — never a 500, never "last write wins".
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, HttpSession, signedInSession } from '../setup';
import { freshAccount, mailLink, scratchProject } from '../setup/accounts';

const baseUrl = inject('baseUrl');
const N = 8;
let projectId: string;
let admin: HttpSession;
let owner: HttpSession;

beforeAll(async () => {
	projectId = await scratchProject(baseUrl, 'Link tests');
	admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
	owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
});

const range = Array.from({ length: N }, (_, i) => i);

async function invitationLink(email: string): Promise<string> {
	const res = await owner.json('POST', `/api/v1/projects/${projectId}/members`, { email, role: 'viewer' });
	expect(res.status).toBe(201);
	return new URL(await mailLink(admin, email, '/invitations/')).pathname;
}

describe(`${N} concurrent uses of one link`, () => {
	it('password reset: one new password is set, the others get 409, and only that password works', async () => {
		const account = await freshAccount(baseUrl, projectId, 'race-reset');
		await admin.form('/admin/users?/reset', { userId: account.userId }, 'text/html');
		const path = new URL(await mailLink(admin, account.email, '/reset-password/')).pathname;
		const results = await Promise.all(
			range.map((i) => new HttpSession(baseUrl).form(path, { password: `racing-password-${i}`, confirm: `racing-password-${i}` }, 'text/html'))
		);
		const statuses = results.map((r) => r.status);
		expect(statuses.filter((s) => s === 303)).toHaveLength(1);
		expect(statuses.filter((s) => s === 409)).toHaveLength(N - 1);
		const winner = statuses.indexOf(303);
		for (const i of range) {
			const s = new HttpSession(baseUrl);
			await s.signIn(account.email, `racing-password-${i}`);
			expect(s.signedIn, `password ${i}`).toBe(i === winner);
		}
	});

	it('invitation, registering: one account is created and signed in, the others get 409', async () => {
		const email = `race-invite-${crypto.randomUUID().slice(0, 8)}@example.test`;
		const path = await invitationLink(email);
		const sessions = range.map(() => new HttpSession(baseUrl));
		const results = await Promise.all(
			sessions.map((s, i) => s.form(`${path}?/register`, { name: `Racer ${i}`, password: 'racing-password', confirm: 'racing-password' }, 'text/html'))
		);
		const statuses = results.map((r) => r.status);
		expect(sessions.filter((s) => s.signedIn)).toHaveLength(1);
		expect(statuses.filter((s) => s === 409)).toHaveLength(N - 1);
		expect(await results[statuses.findIndex((s) => s === 409)].text()).toContain('already used');
		const members = (await (await owner.json('GET', `/api/v1/projects/${projectId}/members`)).json()) as { members: { email: string }[] };
		expect(members.members.filter((m) => m.email === email)).toHaveLength(1);
	});

	it('invitation, accepting while signed in: one membership, the others get 409', async () => {
		const account = await freshAccount(baseUrl, projectId, 'race-accept');
		const other = await scratchProject(baseUrl, 'Link tests, second project');
		const res = await owner.json('POST', `/api/v1/projects/${other}/members`, { email: account.email, role: 'reviewer' });
		expect(res.status).toBe(201);
		const path = new URL(await mailLink(admin, account.email, '/invitations/')).pathname;
		const results = await Promise.all(range.map(() => account.session.form(`${path}?/accept`, {}, 'text/html')));
		const statuses = results.map((r) => r.status);
		expect(statuses.filter((s) => s === 303)).toHaveLength(1);
		expect(statuses.filter((s) => s === 409)).toHaveLength(N - 1);
	});

	it('e-mail sign-in link: one browser is signed in, the others are sent back to sign-in', async () => {
		const account = await freshAccount(baseUrl, projectId, 'race-magic');
		await new HttpSession(baseUrl).form('/signin?/link', { email: account.email, redirectTo: '/projects' }, 'text/html');
		const link = await mailLink(admin, account.email, '/auth/callback/nodemailer');
		const browsers = range.map(() => new HttpSession(baseUrl));
		const results = await Promise.all(browsers.map((b) => b.fetch(link, { headers: { accept: 'text/html' } })));
		expect(browsers.filter((b) => b.signedIn)).toHaveLength(1);
		const refused = results.filter((_, i) => !browsers[i].signedIn);
		for (const r of refused) expect(r.headers.get('location')).toMatch(/\/signin\?error=Verification/);
	});
});

describe('a used or unknown link', () => {
	it('a used invitation answers 409, an unknown one 404', async () => {
		const email = `used-invite-${crypto.randomUUID().slice(0, 8)}@example.test`;
		const path = await invitationLink(email);
		await new HttpSession(baseUrl).form(`${path}?/register`, { name: 'First', password: 'first-password', confirm: 'first-password' });
		const again = await new HttpSession(baseUrl).form(`${path}?/register`, { name: 'Second', password: 'second-password', confirm: 'second-password' }, 'text/html');
		expect(again.status).toBe(409);
		const unknown = await new HttpSession(baseUrl).form('/invitations/invite_nonsense?/register', { name: 'X', password: 'xxxxxxxxxxxx', confirm: 'xxxxxxxxxxxx' }, 'text/html');
		expect(unknown.status).toBe(404);
	});

	it('an unknown reset link answers 404 and changes nothing', async () => {
		const res = await new HttpSession(baseUrl).form('/reset-password/reset_nonsense', { password: 'whatever-password', confirm: 'whatever-password' }, 'text/html');
		expect(res.status).toBe(404);
	});
});

describe('the e-mail sign-in link form', () => {
	/** Status, location and Set-Cookie of asking for a link, and how long the answer took. */
	async function ask(email: string) {
		const started = performance.now();
		const res = await new HttpSession(baseUrl).form('/signin?/link', { email, redirectTo: '/projects' }, 'text/html');
		const ms = performance.now() - started;
		return { status: res.status, location: res.headers.get('location'), cookies: res.headers.getSetCookie().join('\n'), ms };
	}
	const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

	it('answers a known and an unknown address alike: status, location, cookies, and time within noise', async () => {
		const known = await ask(DEMO.reviewer.email);
		const unknown = await ask('nobody-here@example.test');
		expect(known.status).toBe(303);
		expect({ ...unknown, ms: 0 }).toEqual({ ...known, ms: 0 });
		expect(known.location).toBe('/signin/check-email');

		// Interleaved, after a warm-up, so drift on a shared machine affects both alike.
		const times = { known: [] as number[], unknown: [] as number[] };
		for (let i = 0; i < 15; i++) {
			times.known.push((await ask(DEMO.reviewer.email)).ms);
			times.unknown.push((await ask(`nobody-${i}@example.test`)).ms);
		}
		const [k, u] = [median(times.known), median(times.unknown)];
		console.info(`[e-mail link form] median answer: known ${k.toFixed(1)} ms, unknown ${u.toFixed(1)} ms`);
		// Waiting for the SMTP exchange made a known address several milliseconds slower; now within noise.
		expect(Math.abs(k - u)).toBeLessThan(Math.max(3, 0.5 * Math.min(k, u)));
	});
});
