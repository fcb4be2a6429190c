import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { getDb, type Db } from '$lib/server/db';
import { outbox, users } from '$lib/server/db/schema';
import { closeMail } from '$lib/server/mail';
import { stopRealizations } from '$lib/server/realizations';
import { listAudit } from '$lib/server/services/audit';
import { seedDemo } from '$lib/server/services/demo';
import { approveRecipe, commentOnRecipe, createRecipe, deleteRecipe, getRecipe, listRecipeNotes, recipeUrl, requestReview } from '$lib/server/services/recipes';
import { listZonations } from '$lib/server/services/zonations';
import { ServiceError } from '$lib/server/errors';

const ORIGIN = 'https://conefield.example';
let db: Db;
let projectId: string;
type Person = { id: string; name: string | null; email: string };
const people = {} as Record<'owner' | 'analyst' | 'reviewer' | 'viewer', Person>;
let recipeId: string;

const mailsTo = (to: string) => db.select().from(outbox).where(eq(outbox.to, to)).all();

async function refusal(p: Promise<unknown> | (() => unknown)): Promise<ServiceError> {
	try {
		await (typeof p === 'function' ? p() : p);
	} catch (err) {
		if (err instanceof ServiceError) return err;
		throw err;
	}
	throw new Error('expected a ServiceError');
}

beforeAll(async () => {
	process.env.DATABASE_URL = ':memory:';
	delete process.env.SMTP_URL;
	db = getDb();
	projectId = (await seedDemo(db))!;
	for (const role of ['owner', 'analyst', 'reviewer', 'viewer'] as const) {
		people[role] = db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.email, `${role}@conefield.test`)).get()!;
	}
	const z = listZonations(projectId, db)[0];
	recipeId = createRecipe(
		projectId,
		people.analyst.id,
		{
			kind: 'uniform',
			name: 'Review me',
			zonationId: z.id,
			percentiles: [50],
			grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1 } },
			domains: z.domains.map((d) => ({ domainId: d.id, simulate: true }))
		},
		db
	).recipe.id;
}, 120_000);
afterAll(async () => {
	await stopRealizations();
	await closeMail();
});

describe('review of a recipe', () => {
	it('requestReview sets the status, adds the note to the thread and e-mails the project’s reviewers a link to the recipe', async () => {
		const { recipe, notified } = await requestReview(projectId, recipeId, people.analyst, 'Please check the clay values.', ORIGIN, db);
		expect(recipe.status).toBe('review');
		expect(notified).toEqual(['reviewer@conefield.test']);
		await expect.poll(() => mailsTo('reviewer@conefield.test').length).toBe(1);
		const mail = mailsTo('reviewer@conefield.test')[0];
		expect(mail.subject).toBe('Review asked: Review me (Riverside levee (demo))');
		expect(mail.text).toContain('Please check the clay values.');
		expect(mail.text).toContain(recipeUrl(ORIGIN, projectId, recipeId));
		expect(recipeUrl(ORIGIN, projectId, recipeId)).toBe(`${ORIGIN}/projects/${projectId}/simulations?recipe=${recipeId}`);
		expect(listRecipeNotes(projectId, recipeId, db).map((n) => [n.kind, n.by?.name, n.body])).toEqual([['review-request', 'Ana Analyst', 'Please check the clay values.']]);
	});

	it('a comment joins the thread and e-mails the recipe’s author; the author’s own comment e-mails nobody', async () => {
		const { comment, notified } = await commentOnRecipe(projectId, recipeId, people.reviewer, 'Why P50 for the clay?', ORIGIN, db);
		expect([comment.kind, comment.by?.name, comment.body]).toEqual(['comment', 'Rui Reviewer', 'Why P50 for the clay?']);
		expect(notified).toEqual(['analyst@conefield.test']);
		await expect.poll(() => mailsTo('analyst@conefield.test').length).toBe(1);
		expect(mailsTo('analyst@conefield.test')[0].text).toContain('Why P50 for the clay?');
		expect((await commentOnRecipe(projectId, recipeId, people.analyst, 'It is the baseline.', ORIGIN, db)).notified).toEqual([]);
	});

	it('the author cannot approve their own recipe (403)', async () => {
		const err = await refusal(approveRecipe(projectId, recipeId, people.analyst, 'Looks fine to me.', ORIGIN, db));
		expect(err.status).toBe(403);
		expect(err.message).toBe('You made Review me; another reviewer must approve it.');
		expect(getRecipe(projectId, recipeId, db).approval).toBeNull();
	});

	it('approveRecipe records who approved which hash and when, with the comment, and tells the author', async () => {
		const before = Date.now();
		const { recipe, notified } = await approveRecipe(projectId, recipeId, people.reviewer, 'Values checked against the domain statistics.', ORIGIN, db);
		expect(recipe.status).toBe('approved');
		expect(recipe.approval).toMatchObject({ by: { id: people.reviewer.id, name: 'Rui Reviewer' }, hash: recipe.hash, comment: 'Values checked against the domain statistics.' });
		expect(Date.parse(recipe.approval!.at)).toBeGreaterThanOrEqual(before - 5);
		expect(notified).toEqual(['analyst@conefield.test']);
		const entry = listAudit(projectId, { kind: 'recipe', limit: 1 }, db)[0];
		expect([entry.action, entry.user?.name]).toEqual(['approved', 'Rui Reviewer']);
		expect(entry.detail).toContain(recipe.hash);
	});

	it('an approved recipe is frozen: deleting it is a 409 that says who approved it; approving or asking for review again is a 409', async () => {
		const del = await refusal(() => deleteRecipe(projectId, recipeId, db));
		expect(del.status).toBe(409);
		expect(del.message).toMatch(/^Review me was approved by Rui Reviewer on \d{4}-\d\d-\d\d \(SHA-256 [0-9a-f]{12}…\): an approved recipe is frozen and cannot be deleted\.$/);
		expect(getRecipe(projectId, recipeId, db).id).toBe(recipeId);
		expect((await refusal(approveRecipe(projectId, recipeId, people.owner, 'Me too.', ORIGIN, db))).status).toBe(409);
		expect((await refusal(requestReview(projectId, recipeId, people.analyst, '', ORIGIN, db))).status).toBe(409);
	});

	it('two concurrent approvals of one recipe: one wins, the other is a 409', async () => {
		const z = listZonations(projectId, db)[1];
		const id = createRecipe(
			projectId,
			people.analyst.id,
			{
				kind: 'uniform',
				name: 'Race',
				zonationId: z.id,
				percentiles: [40],
				grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1 } },
				domains: z.domains.map((d) => ({ domainId: d.id, simulate: true }))
			},
			db
		).recipe.id;
		const results = await Promise.allSettled([approveRecipe(projectId, id, people.reviewer, 'a', ORIGIN, db), approveRecipe(projectId, id, people.owner, 'b', ORIGIN, db)]);
		expect(results.map((r) => r.status).sort()).toEqual(['fulfilled', 'rejected']);
		const lost = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
		expect((lost.reason as ServiceError).status).toBe(409);
		expect(listRecipeNotes(projectId, id, db).filter((n) => n.kind === 'approval')).toHaveLength(1);
	});

	it('a recipe of another project is a 404 for each step', async () => {
		const other = crypto.randomUUID();
		expect((await refusal(requestReview(other, recipeId, people.analyst, '', ORIGIN, db))).status).toBe(404);
		expect((await refusal(approveRecipe(other, recipeId, people.reviewer, 'x', ORIGIN, db))).status).toBe(404);
		expect((await refusal(commentOnRecipe(other, recipeId, people.reviewer, 'x', ORIGIN, db))).status).toBe(404);
		expect((await refusal(() => listRecipeNotes(other, recipeId, db))).status).toBe(404);
	});
});
