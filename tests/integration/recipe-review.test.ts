/**
 * Review of recipes over HTTP against the built server: the role matrix of asking for review, commenting and
 * approving (the routes guard with CAPABILITIES of src/lib/server/auth/roles.ts, and so do the expectations here),
 * the e-mails they send landing in the outbox with a link to the recipe, an approval that records the hash and
 * freezes the recipe (DELETE → 409 with the reason), the self-approval and double-approval refusals, malformed
 * bodies and the refusals across projects.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';
import { CAPABILITIES, meets, type ProjectRole } from '../../src/lib/server/auth/roles';

const baseUrl = inject('baseUrl');
const ROLES = ['viewer', 'reviewer', 'analyst', 'owner'] as const satisfies readonly ProjectRole[];
const session = {} as Record<ProjectRole, HttpSession>;
let admin: HttpSession;
let projectId: string;
let base: string;
let zonation: { id: string; domains: { id: string }[] };
let emails: Record<ProjectRole, string>;
let serial = 0;

const grid = { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1 } };

async function errorOf(res: Response) {
	return ((await res.json()) as { error: { code: string; message: string; issues?: { path: unknown[]; message: string }[] } }).error;
}

/** A new recipe (its own seed, so its own hash) made by `author`. */
async function recipeBy(author: HttpSession, label: string): Promise<{ id: string; name: string; hash: string }> {
	const name = `Review ${label} ${++serial}`;
	const res = await author.json('POST', base, {
		name,
		zonationId: zonation.id,
		seed: `review-${label}-${serial}-${crypto.randomUUID().slice(0, 6)}`,
		realizations: 2,
		grid,
		domains: zonation.domains.map((d) => ({ domainId: d.id, simulate: true }))
	});
	if (res.status !== 201) throw new Error(`create failed: ${res.status} ${await res.text()}`);
	return (await res.json()).recipe;
}

/** The newest message in the outbox, read as the site admin: to, subject and text (links as the page shows them). */
async function newestMail(): Promise<{ to: string; subject: string; html: string }> {
	const html = await (await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).text();
	const open = /<article[^>]*data-testid="outbox-message"[^]*?<\/article>/.exec(html)?.[0] ?? '';
	return {
		to: /<dt>To<\/dt><dd>([^<]*)<\/dd>/.exec(open)?.[1] ?? '',
		subject: /<h2[^>]*>([^<]*)<\/h2>/.exec(open)?.[1] ?? '',
		html: open.replaceAll('&amp;', '&')
	};
}

beforeAll(async () => {
	const signed = await Promise.all(ROLES.map((r) => signedInSession(baseUrl, DEMO[r].email, DEMO[r].password)));
	ROLES.forEach((r, i) => (session[r] = signed[i]));
	admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
	const { projects } = (await (await session.viewer.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	base = `/api/v1/projects/${projectId}/recipes`;
	const { zonations } = await (await session.viewer.json('GET', `/api/v1/projects/${projectId}/zonations`)).json();
	zonation = zonations.find((z: { name: string }) => z.name === 'Sand split at channel');
	emails = Object.fromEntries(ROLES.map((r) => [r, DEMO[r].email])) as Record<ProjectRole, string>;
}, 120_000);

describe('the role matrix of review (CAPABILITIES: request review = editRecipes, comment = comment, approve = approve)', () => {
	it('POST …/review: allowed from the editRecipes role up (200, status review), 403 below', async () => {
		for (const role of ROLES) {
			const recipe = await recipeBy(session.analyst, `ask-${role}`);
			const res = await session[role].json('POST', `${base}/${recipe.id}/review`, { note: `from ${role}` });
			if (meets(role, CAPABILITIES.editRecipes)) {
				expect(res.status, role).toBe(200);
				expect((await res.json()).recipe.status).toBe('review');
			} else {
				expect(res.status, role).toBe(403);
				expect((await errorOf(res)).code).toBe('forbidden');
				expect((await (await session.viewer.json('GET', `${base}/${recipe.id}`)).json()).recipe.status).toBe('ready');
			}
		}
	});

	it('POST …/comments: allowed from the comment role up (201, in the thread), 403 below; everyone reads the thread', async () => {
		const recipe = await recipeBy(session.analyst, 'comments');
		for (const role of ROLES) {
			const res = await session[role].json('POST', `${base}/${recipe.id}/comments`, { body: `A note from the ${role}.` });
			expect(res.status, role).toBe(meets(role, CAPABILITIES.comment) ? 201 : 403);
		}
		const thread = await session.viewer.json('GET', `${base}/${recipe.id}/comments`);
		expect(thread.status).toBe(200);
		const bodies = (await thread.json()).comments.map((c: { body: string }) => c.body);
		expect(bodies).toEqual(ROLES.filter((r) => meets(r, CAPABILITIES.comment)).map((r) => `A note from the ${r}.`));
	});

	it('POST …/approval: allowed from the approve role up for anyone but the author (200, approved), 403 below', async () => {
		for (const role of ROLES) {
			// The analyst may approve what someone else made; the owner makes the recipe the analyst is asked to approve.
			const recipe = await recipeBy(role === 'analyst' ? session.owner : session.analyst, `approve-${role}`);
			const res = await session[role].json('POST', `${base}/${recipe.id}/approval`, { comment: `Checked by the ${role}.` });
			if (meets(role, CAPABILITIES.approve)) {
				expect(res.status, role).toBe(200);
				const { recipe: approved } = await res.json();
				expect(approved.status).toBe('approved');
				expect(approved.approval.by.name).toBeTruthy();
				expect(approved.approval.hash).toBe(recipe.hash);
			} else {
				expect(res.status, role).toBe(403);
				expect((await (await session.viewer.json('GET', `${base}/${recipe.id}`)).json()).recipe.approval).toBeNull();
				// Not frozen: its author may still delete it.
				expect((await session.analyst.json('DELETE', `${base}/${recipe.id}`)).status).toBe(204);
			}
		}
	});

	it('the author cannot approve their own recipe (403 with the reason), even as owner', async () => {
		for (const author of ['analyst', 'owner'] as const) {
			const recipe = await recipeBy(session[author], `self-${author}`);
			const res = await session[author].json('POST', `${base}/${recipe.id}/approval`, { comment: 'Looks right to me.' });
			expect(res.status, author).toBe(403);
			expect((await errorOf(res)).message).toMatch(/another reviewer must approve it/);
		}
	});

	it('refuses without a session (401), a bad token (401), a non-member (404), a recipe of another project (404)', async () => {
		const recipe = await recipeBy(session.analyst, 'outsiders');
		const other = (await (await session.analyst.json('POST', '/api/v1/projects', { name: `Review elsewhere ${serial}` })).json()).project.id;
		for (const [path, body] of [
			['review', { note: '' }],
			['comments', { body: 'x' }],
			['approval', { comment: 'x' }]
		] as const) {
			const url = `${base}/${recipe.id}/${path}`;
			expect((await new HttpSession(baseUrl).json('POST', url, body)).status, path).toBe(401);
			expect((await new HttpSession(baseUrl).json('POST', url, body, { authorization: 'Bearer cf_bad' })).status, path).toBe(401);
			expect((await admin.json('POST', url, body)).status, path).toBe(404);
			expect((await session.analyst.json('POST', `/api/v1/projects/${other}/recipes/${recipe.id}/${path}`, body)).status, path).toBe(404);
			expect((await session.owner.json('POST', `${base}/${crypto.randomUUID()}/${path}`, body)).status, path).toBe(404);
		}
		expect((await (await session.viewer.json('GET', `${base}/${recipe.id}/comments`)).json()).comments).toEqual([]);
	});

	it('refuses an empty approval comment or comment (422), unreadable JSON (400), unknown fields (422) and a foreign origin (403)', async () => {
		const recipe = await recipeBy(session.analyst, 'malformed');
		const empty = await session.reviewer.json('POST', `${base}/${recipe.id}/approval`, { comment: '   ' });
		expect(empty.status).toBe(422);
		expect((await errorOf(empty)).issues!.map((i) => i.path.join('.'))).toEqual(['comment']);
		expect((await session.reviewer.json('POST', `${base}/${recipe.id}/comments`, { body: '' })).status).toBe(422);
		expect((await session.reviewer.json('POST', `${base}/${recipe.id}/approval`, { comment: 'ok', hash: 'x' })).status).toBe(422);
		const broken = await session.reviewer.fetch(`${base}/${recipe.id}/approval`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"comment": ' });
		expect(broken.status).toBe(400);
		const foreign = await session.reviewer.fetch(`${base}/${recipe.id}/approval`, {
			method: 'POST',
			headers: { origin: 'http://evil.example', 'content-type': 'text/plain' },
			body: JSON.stringify({ comment: 'ok' })
		});
		expect(foreign.status).toBe(403);
		expect((await (await session.viewer.json('GET', `${base}/${recipe.id}`)).json()).recipe.approval).toBeNull();
	});
});

describe('approval freezes the recipe', () => {
	let recipe: { id: string; name: string; hash: string };
	let approval: { by: { name: string }; at: string; hash: string; comment?: string };

	beforeAll(async () => {
		recipe = await recipeBy(session.analyst, 'frozen');
		const res = await session.reviewer.json('POST', `${base}/${recipe.id}/approval`, { comment: 'Variograms and rules checked against the logs.' });
		expect(res.status).toBe(200);
		approval = (await res.json()).recipe.approval;
	});

	it('GET says who approved which hash and when', async () => {
		const { recipe: view } = await (await session.viewer.json('GET', `${base}/${recipe.id}`)).json();
		expect(view.status).toBe('approved');
		expect(view.approval).toEqual(approval);
		expect(view.approval.hash).toBe(recipe.hash);
		expect(Math.abs(Date.parse(view.approval.at) - Date.now())).toBeLessThan(5 * 60_000);
		const { comments } = await (await session.viewer.json('GET', `${base}/${recipe.id}/comments`)).json();
		expect(comments.map((c: { kind: string; body: string }) => [c.kind, c.body])).toEqual([['approval', 'Variograms and rules checked against the logs.']]);
	});

	it('DELETE is 409 with the reason (who approved it, when, the hash), for the analyst and the owner; it stays listed', async () => {
		for (const role of ['analyst', 'owner'] as const) {
			const res = await session[role].json('DELETE', `${base}/${recipe.id}`);
			expect(res.status, role).toBe(409);
			const error = await errorOf(res);
			expect(error.code).toBe('conflict');
			expect(error.message).toContain('frozen and cannot be deleted');
			expect(error.message).toContain(approval.by.name);
			expect(error.message).toContain(approval.at.slice(0, 10));
			expect(error.message).toContain(recipe.hash.slice(0, 12));
		}
		const { recipes } = await (await session.viewer.json('GET', base)).json();
		expect(recipes.find((r: { id: string }) => r.id === recipe.id).status).toBe('approved');
	});

	it('a second approval and a review request are 409; comments are still welcome', async () => {
		const again = await session.owner.json('POST', `${base}/${recipe.id}/approval`, { comment: 'Me too.' });
		expect(again.status).toBe(409);
		expect((await errorOf(again)).message).toMatch(/already approved/);
		expect((await session.analyst.json('POST', `${base}/${recipe.id}/review`, { note: '' })).status).toBe(409);
		expect((await session.reviewer.json('POST', `${base}/${recipe.id}/comments`, { body: 'For the record: used in run 3.' })).status).toBe(201);
	});

	it('two approvals at once: exactly one is recorded', async () => {
		const fresh = await recipeBy(session.analyst, 'race');
		const answers = await Promise.all(['reviewer', 'owner'].map((r) => session[r as ProjectRole].json('POST', `${base}/${fresh.id}/approval`, { comment: `race ${r}` })));
		expect(answers.map((a) => a.status).sort()).toEqual([200, 409]);
		const { comments } = await (await session.viewer.json('GET', `${base}/${fresh.id}/comments`)).json();
		expect(comments.filter((c: { kind: string }) => c.kind === 'approval')).toHaveLength(1);
	});
});

describe('e-mail to reviewers and authors lands in the outbox', () => {
	it('asking for review mails the project’s reviewer a link to the recipe, with the note; the answer lists whom it reached', async () => {
		const recipe = await recipeBy(session.analyst, 'mail');
		const res = await session.analyst.json('POST', `${base}/${recipe.id}/review`, { note: 'Please look at the channel contact.' });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect([body.notified, body.failed]).toEqual([[emails.reviewer], []]);
		const mail = await newestMail();
		expect(mail.to).toBe(emails.reviewer);
		expect(mail.subject).toBe(`Review asked: ${recipe.name} (${DEMO_PROJECT_NAME})`);
		expect(mail.html).toContain('Please look at the channel contact.');
		expect(mail.html).toContain(recipe.hash);
		const link = /href="([^"]*\/simulations\?recipe=[^"]+)"/.exec(mail.html)![1];
		expect(new URL(link).origin).toBe(baseUrl);
		expect(new URL(link).pathname).toBe(`/projects/${projectId}/simulations`);
		expect(new URL(link).searchParams.get('recipe')).toBe(recipe.id);
		// The link opens the Simulations page for the reviewer.
		expect((await session.reviewer.fetch(new URL(link).pathname + new URL(link).search, { headers: { accept: 'text/html' } })).status).toBe(200);
	});

	it('a comment mails the recipe’s author; the author’s own comment mails no one', async () => {
		const recipe = await recipeBy(session.analyst, 'comment-mail');
		const res = await session.reviewer.json('POST', `${base}/${recipe.id}/comments`, { body: 'Why 2 realizations?' });
		expect((await res.json()).notified).toEqual([emails.analyst]);
		const mail = await newestMail();
		expect([mail.to, mail.subject]).toEqual([emails.analyst, `Comment on ${recipe.name} (${DEMO_PROJECT_NAME})`]);
		expect(mail.html).toContain('Why 2 realizations?');
		expect(mail.html).toContain(`recipe=${recipe.id}`);
		const own = await session.analyst.json('POST', `${base}/${recipe.id}/comments`, { body: 'To check the search.' });
		expect((await own.json()).notified).toEqual([]);
		expect((await newestMail()).subject).toBe(mail.subject);
	});

	it('an approval mails the author with the approver’s comment', async () => {
		const recipe = await recipeBy(session.analyst, 'approval-mail');
		const res = await session.reviewer.json('POST', `${base}/${recipe.id}/approval`, { comment: 'Fit for the deformation runs.' });
		expect((await res.json()).notified).toEqual([emails.analyst]);
		const mail = await newestMail();
		expect([mail.to, mail.subject]).toEqual([emails.analyst, `Approved: ${recipe.name} (${DEMO_PROJECT_NAME})`]);
		expect(mail.html).toContain('Fit for the deformation runs.');
		expect(mail.html).toContain(recipe.hash);
	});
});
