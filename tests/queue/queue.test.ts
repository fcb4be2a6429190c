/**
 * The realization queue end to end: Debian's redis-server on a loopback port, two worker processes from the built
 * entry (build/worker/queue-worker.js), and two built servers over one database — one with REDIS_URL (the queue),
 * one without (in process, the reference). A summary and an export job made through the queue equal the in-process
 * ones byte for byte; a worker killed mid-range loses nothing; Redis restarted mid-export (without persistence, so
 * it comes back empty) is survived, and Redis gone for longer than the grace fails the export loudly with nothing
 * left that looks complete; cancel ends the run's waiting jobs and results; a range that fails every attempt fails
 * the export with its reason; the health endpoint and who may read it.
 */
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';
import { freshDataDir, startApp, startRedis, startWorker, stopAll, type TestApp, type TestRedis, type TestWorker } from '../setup/queue';
import { recipeSchema, regenerate } from '../../src/lib/geostat/index';
import { ensembleMap } from '../../src/lib/ensemble/index';
import { expectSameBits } from '../asserts';

let redis: TestRedis;
let client: Redis;
let local: TestApp;
let queued: TestApp;
let dataDir: string;
const workers: TestWorker[] = [];
let onQueue: HttpSession;
let inProcess: HttpSession;
let admin: HttpSession;
let base: string;
let zonation: { id: string; domains: { id: string }[] };
let coarse: { id: string; hash: string };
let fine: { id: string; hash: string };
/** The in-process export of `fine` (realizations 0–5), the reference of the fault tests. */
let fineReference: string;

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));
const sha = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

const setup = (name: string, seed: string, grid: { chainage: number; elevation: number }) => ({
	name,
	zonationId: zonation.id,
	seed,
	realizations: 6,
	grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: grid.chainage }, elevation: { from: -12, to: 5, cell: grid.elevation } },
	domains: zonation.domains.map((d) => ({ domainId: d.id, simulate: true }))
});

async function createRecipe(body: unknown): Promise<{ id: string; hash: string }> {
	const res = await inProcess.json('POST', `${base}/recipes`, body);
	if (res.status !== 201 && res.status !== 200) throw new Error(`create failed: ${res.status} ${await res.text()}`);
	return (await res.json()).recipe;
}

interface JobView {
	id: string;
	status: string;
	progress: number;
	error: string | null;
}

async function startExport(session: HttpSession, recipeId: string, realizations = '0-5'): Promise<JobView> {
	const res = await session.json('POST', `${base}/exports`, { recipeId, realizations, format: 'csv' });
	expect(res.status).toBe(202);
	return (await res.json()).export;
}

async function jobOf(session: HttpSession, id: string): Promise<JobView> {
	return (await (await session.json('GET', `${base}/exports/${id}`)).json()).export;
}

async function finished(session: HttpSession, id: string, timeoutMs = 120_000): Promise<JobView> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const job = await jobOf(session, id);
		if (!['queued', 'running'].includes(job.status)) return job;
		if (Date.now() > deadline) throw new Error(`export ${id} still ${job.status} after ${timeoutMs} ms`);
		await wait(250);
	}
}

async function downloaded(session: HttpSession, id: string): Promise<string> {
	const res = await session.fetch(`${base}/exports/${id}/download`);
	expect(res.status).toBe(200);
	return sha(new Uint8Array(await res.arrayBuffer()));
}

/** Lines of a worker's log that started a range of the recipe with this hash. */
const rangesOf = (w: TestWorker, hash: string) => w.log().split('\n').filter((l) => l.includes(`of ${hash.slice(0, 12)}`));
/** The same over every worker. */
const rangesStarted = (hash: string) => workers.flatMap((w) => rangesOf(w, hash));

async function until(what: () => boolean | Promise<boolean>, timeoutMs = 60_000, label = 'condition'): Promise<void> {
	const deadline = Date.now() + timeoutMs;
	while (!(await what())) {
		if (Date.now() > deadline) throw new Error(`${label} not met within ${timeoutMs} ms`);
		await wait(50);
	}
}

async function health(session: HttpSession, headers: Record<string, string> = {}) {
	const res = await session.json('GET', '/api/v1/health/queue', undefined, headers);
	return { status: res.status, body: await res.json() };
}

beforeAll(async () => {
	redis = await startRedis();
	client = new Redis(redis.url, { maxRetriesPerRequest: null });
	client.on('error', () => undefined);
	dataDir = freshDataDir();
	// The in-process server seeds the demo first; the queue's server opens the same database after it.
	local = await startApp(dataDir, { SEED_DEMO: '1' });
	queued = await startApp(dataDir, { SEED_DEMO: '0', REDIS_URL: redis.url, QUEUE_REDIS_GRACE_SECONDS: '6' });
	workers.push(...(await Promise.all([startWorker(redis.url, 'w1'), startWorker(redis.url, 'w2')])));
	[onQueue, inProcess, admin] = await Promise.all([
		signedInSession(queued.baseUrl, DEMO.analyst.email, DEMO.analyst.password),
		signedInSession(local.baseUrl, DEMO.analyst.email, DEMO.analyst.password),
		signedInSession(queued.baseUrl, DEMO.admin.email, DEMO.admin.password)
	]);
	const { projects } = (await (await inProcess.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	base = `/api/v1/projects/${projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id}`;
	const { zonations } = await (await inProcess.json('GET', `${base}/zonations`)).json();
	zonation = zonations.find((z: { name: string }) => z.name === 'Sand split at channel');
	coarse = await createRecipe(setup('Queue coarse', 'queue-coarse', { chainage: 10, elevation: 1 }));
	// About 68,000 cells: a realization takes a second or two on one thread, so faults can strike mid-range.
	fine = await createRecipe(setup('Queue fine', 'queue-fine', { chainage: 1, elevation: 0.1 }));
	const reference = await finished(inProcess, (await startExport(inProcess, fine.id)).id);
	expect(reference.status).toBe('done');
	fineReference = await downloaded(inProcess, reference.id);
}, 300_000);

afterAll(async () => {
	client?.disconnect();
	await stopAll();
	if (process.env.CONEFIELD_TEST_LOG) console.log(queued?.log(), workers.map((w) => w.log()).join('\n'));
});

describe('GET /api/v1/health/queue', () => {
	it('without REDIS_URL the server makes realizations in process, and says so', async () => {
		const inProcessAdmin = await signedInSession(local.baseUrl, DEMO.admin.email, DEMO.admin.password);
		const { status, body } = await health(inProcessAdmin);
		expect(status).toBe(200);
		expect(body.runner).toBe('in-process');
		expect(body.redis).toBeUndefined();
		expect(body.workers).toHaveLength(1);
	});

	it('with REDIS_URL reports bullmq, Redis ready, the counts and both workers with their last heartbeat', async () => {
		const { status, body } = await health(admin);
		expect(status).toBe(200);
		expect(body).toMatchObject({ runner: 'bullmq', redis: { address: redis.url, status: 'ready' }, waiting: 0, active: 0, failed: 0 });
		expect(body.workers.map((w: { id: string }) => w.id)).toEqual(['w1', 'w2']);
		for (const w of body.workers) {
			expect(w.threads).toBe(1);
			expect(Date.now() - Date.parse(w.lastSeen)).toBeLessThan(20_000);
		}
	});

	it('is for site admins only: 401 without a session or with a bad token, 403 for a member, 200 with an admin’s token', async () => {
		expect((await health(new HttpSession(queued.baseUrl))).status).toBe(401);
		expect((await health(new HttpSession(queued.baseUrl), { authorization: 'Bearer not-a-token' })).status).toBe(401);
		expect((await health(onQueue)).status).toBe(403);
		const { token } = await (await admin.json('POST', '/api/v1/account/tokens', { name: 'queue health', expiresInDays: 7 })).json();
		const res = await fetch(`${queued.baseUrl}/api/v1/health/queue`, { headers: { authorization: `Bearer ${token}` } });
		expect(res.status).toBe(200);
		expect((await res.json()).runner).toBe('bullmq');
	});
});

describe('through the queue, byte for byte as in process', () => {
	it('a summary (mean, P50) made by the workers equals the in-process one and ensembleMap over regenerate() here', async () => {
		const db = new Database(join(dataDir, 'conefield.db'));
		try {
			for (const stat of ['mean', 'p50']) {
				const viaQueue = await (await onQueue.json('GET', `${base}/recipes/${coarse.id}/summary?stat=${stat}`)).text();
				db.prepare('DELETE FROM recipe_summaries WHERE recipe_hash = ?').run(coarse.hash);
				const viaProcess = await (await inProcess.json('GET', `${base}/recipes/${coarse.id}/summary?stat=${stat}`)).text();
				db.prepare('DELETE FROM recipe_summaries WHERE recipe_hash = ?').run(coarse.hash);
				expect(viaQueue).toBe(viaProcess);
				const recipe = recipeSchema.parse(JSON.parse(await (await inProcess.fetch(`${base}/recipes/${coarse.id}/recipe.json`)).text()));
				const mine = ensembleMap(Array.from({ length: 6 }, (_, r) => regenerate(recipe, r)), stat as 'mean' | 'p50');
				const served = Float64Array.from(JSON.parse(viaQueue).values as (number | null)[], (v) => (v === null ? NaN : v));
				expectSameBits(served, mine, stat);
			}
		} finally {
			db.close();
		}
		expect(rangesStarted(coarse.hash).length).toBeGreaterThan(0);
	});

	it('an export job and an export.zip download made by the workers equal the in-process files', async () => {
		const before = rangesStarted(fine.hash).length;
		const job = await finished(onQueue, (await startExport(onQueue, fine.id)).id);
		expect(job).toMatchObject({ status: 'done', progress: 1, error: null });
		expect(await downloaded(onQueue, job.id)).toBe(fineReference);
		expect(rangesStarted(fine.hash).length).toBeGreaterThan(before);
		const zip = `${base}/recipes/${coarse.id}/export.zip?realizations=1-4&format=vtk`;
		const [a, b] = await Promise.all([onQueue.fetch(zip), inProcess.fetch(zip)]);
		expect(sha(new Uint8Array(await a.arrayBuffer()))).toBe(sha(new Uint8Array(await b.arrayBuffer())));
	});
});

describe('faults', () => {
	it('a worker killed (SIGKILL) mid-range loses nothing: the range is retried by the other, the file is identical', async () => {
		const before = new Map(workers.map((w) => [w, rangesOf(w, fine.hash).length]));
		const job = await startExport(onQueue, fine.id);
		let killed: TestWorker | undefined;
		await until(() => (killed = workers.find((w) => rangesOf(w, fine.hash).length > before.get(w)!)) !== undefined, 60_000, 'a range started');
		await wait(300);
		await killed!.stop('SIGKILL');
		const other = workers.find((w) => w !== killed)!;
		const done = await finished(onQueue, job.id);
		expect(done.status).toBe('done');
		expect(await downloaded(onQueue, job.id)).toBe(fineReference);
		// The killed worker's range was given to the other one (its log shows the second attempt or a later job).
		expect(rangesOf(other, fine.hash).length - before.get(other)!).toBeGreaterThanOrEqual(2);
		workers.splice(workers.indexOf(killed!), 1, await startWorker(redis.url, `${killed!.name}b`));
	});

	it('Redis stopped and started again mid-export (coming back empty): the export goes on and its file is identical', async () => {
		const before = rangesStarted(fine.hash).length;
		const job = await startExport(onQueue, fine.id);
		await until(() => rangesStarted(fine.hash).length > before, 60_000, 'a range started');
		await wait(500);
		await redis.stop();
		await wait(1500);
		await redis.start();
		const done = await finished(onQueue, job.id);
		expect(done).toMatchObject({ status: 'done', error: null });
		expect(await downloaded(onQueue, job.id)).toBe(fineReference);
	});

	it('Redis gone for longer than the grace: the export fails saying so, no file is kept or served, health answers 503', async () => {
		await until(async () => (await health(admin)).body.workers?.length === 2, 30_000, 'both workers beating');
		const before = rangesStarted(fine.hash).length;
		const job = await startExport(onQueue, fine.id);
		await until(() => rangesStarted(fine.hash).length > before, 60_000, 'a range started');
		await redis.stop();
		try {
			const down = await health(admin);
			expect(down.status).toBe(503);
			expect(down.body.error).toMatch(/did not answer/);
			const failed = await finished(onQueue, job.id, 60_000);
			expect(failed.status).toBe('failed');
			expect(failed.error).toMatch(new RegExp(`Redis at ${redis.url} did not answer for 6 s`));
			expect((await onQueue.fetch(`${base}/exports/${job.id}/download`)).status).toBe(409);
			expect(existsSync(join(dataDir, 'exports', `${job.id}.zip`))).toBe(false);
			expect(existsSync(join(dataDir, 'exports', `${job.id}.zip.part`))).toBe(false);
		} finally {
			await redis.start();
		}
		await until(async () => (await health(admin)).body.workers?.length === 2, 30_000, 'workers back');
	});

	it('cancel stops reading, removes the waiting ranges and leaves no results in Redis and no file', async () => {
		const before = rangesStarted(fine.hash).length;
		const job = await startExport(onQueue, fine.id, '0-5');
		await until(() => rangesStarted(fine.hash).length > before, 60_000, 'a range started');
		expect((await onQueue.json('DELETE', `${base}/exports/${job.id}`)).status).toBe(204);
		expect((await finished(onQueue, job.id)).status).toBe('cancelled');
		await until(
			async () => {
				const h = (await health(admin)).body;
				return h.waiting === 0 && h.active === 0 && (await client.keys('conefield:out:*')).length === 0;
			},
			20_000,
			'queue empty after cancel'
		);
		expect(existsSync(join(dataDir, 'exports', `${job.id}.zip`))).toBe(false);
	});

	it('a range that fails every attempt fails the export with the reason (here: a recipe in Redis that does not match its hash)', async () => {
		const poisoned = await createRecipe(setup('Queue poisoned', 'queue-poisoned', { chainage: 20, elevation: 1 }));
		await client.set(`conefield:recipe:${poisoned.hash}`, '{"not":"the recipe"}', 'EX', 600);
		const job = await finished(onQueue, (await startExport(onQueue, poisoned.id, '0-1')).id);
		expect(job.status).toBe('failed');
		expect(job.error).toMatch(/^Realizations 0–1 failed on the queue's workers 3 times: the recipe stored under [0-9a-f]{12}… does not have that hash$/);
		expect((await onQueue.fetch(`${base}/exports/${job.id}/download`)).status).toBe(409);
		expect((await health(admin)).body.failed).toBeGreaterThanOrEqual(1);
		await client.del(`conefield:recipe:${poisoned.hash}`);
	});
});

describe('shutdown', () => {
	it('SIGTERM: a worker finishes and leaves the list, the queue’s server closes its connections and exits', async () => {
		const [first] = workers;
		expect(await first.stop()).toBe('exited');
		expect(first.log()).toMatch(/SIGTERM: finishing 0 job\(s\), taking no more[\s\S]*stopped/);
		expect((await client.keys('conefield:worker:*')).sort()).toEqual([`conefield:worker:${workers[1].name}`]);
		expect(await queued.stop()).toBe('exited');
	});
});
