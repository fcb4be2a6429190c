/**
 * The recipes API over HTTP on loopback against the built server (a contract: paths and shapes exactly as
 * issue 12 gives them): every role, the refusals (no session, bad token, another project, a role too low, a
 * foreign origin, malformed and invalid bodies, concurrent duplicates), recipe.json hashing to its hash,
 * realizations regenerated on the server equal to regenerate() here bit for bit, ensemble maps equal to
 * ensembleMap() here, and a simple request answered while a summary of 20 realizations computes.
 */
import { createHash } from 'node:crypto';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';
import { recipeSchema, regenerate, type Recipe } from '../../src/lib/geostat/index';
import { ensembleMap } from '../../src/lib/ensemble/index';
import { expectSameBits } from '../asserts';

const baseUrl = inject('baseUrl');

let analyst: HttpSession;
let reviewer: HttpSession;
let viewer: HttpSession;
let owner: HttpSession;
let admin: HttpSession;
let demoId: string;
let zonation: { id: string; name: string; domains: { id: string; name: string }[] };
let base: string;

// A coarse grid over the demo section: a few hundred cells a realization.
const coarse = { geometry: '2d', chainage: { from: 0, to: 400, cell: 10 }, elevation: { from: -12, to: 5, cell: 1 } };
const setup = (over: Record<string, unknown> = {}) => ({
	name: 'API coarse',
	zonationId: zonation.id,
	seed: 'api-1',
	realizations: 4,
	grid: coarse,
	domains: zonation.domains.map((d) => ({ domainId: d.id, simulate: true })),
	...over
});

async function errorOf(res: Response) {
	return ((await res.json()) as { error: { code: string; message: string; issues?: { path: unknown[]; message: string }[] } }).error;
}

/** JSON values with null where not simulated, as a Float64Array with NaN there. */
const float64 = (values: (number | null)[]) => Float64Array.from(values, (v) => (v === null ? NaN : v));

async function created(session: HttpSession, body: unknown): Promise<{ id: string; hash: string; realizations: number }> {
	const res = await session.json('POST', base, body);
	if (res.status !== 201 && res.status !== 200) throw new Error(`create failed: ${res.status} ${await res.text()}`);
	return (await res.json()).recipe;
}

async function recipeDocument(id: string): Promise<{ text: string; recipe: Recipe }> {
	const text = await (await viewer.fetch(`${base}/${id}/recipe.json`)).text();
	return { text, recipe: recipeSchema.parse(JSON.parse(text)) };
}

beforeAll(async () => {
	[analyst, reviewer, viewer, owner, admin] = await Promise.all([
		signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password),
		signedInSession(baseUrl, DEMO.reviewer.email, DEMO.reviewer.password),
		signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password),
		signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password),
		signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password)
	]);
	const { projects } = (await (await analyst.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	const { zonations } = await (await viewer.json('GET', `/api/v1/projects/${demoId}/zonations`)).json();
	zonation = zonations.find((z: { name: string }) => z.name === 'Sand split at channel');
	base = `/api/v1/projects/${demoId}/recipes`;
}, 120_000);

describe('GET /api/v1/projects/:id/recipes', () => {
	it('lists the demo recipes with exactly the contract fields, for every role', async () => {
		for (const s of [viewer, reviewer, analyst, owner]) {
			const res = await s.json('GET', base);
			expect(res.status).toBe(200);
			const { recipes } = await res.json();
			expect(recipes.filter((r: { kind: string }) => r.kind === 'sgs').length).toBeGreaterThanOrEqual(2);
			expect(recipes.filter((r: { kind: string }) => r.kind === 'uniform').length).toBeGreaterThanOrEqual(1);
			const seeded = recipes.filter((r: { name: string }) => /^(Uniform baseline, P50|Sand (split at channel|grouped), \d+ realizations$)/.test(r.name));
			expect(seeded).toHaveLength(3);
			expect(seeded.map((r: { status: string }) => r.status)).toEqual(seeded.map(() => 'ready'));
			for (const r of recipes) {
				expect(Object.keys(r).sort()).toEqual(['createdAt', 'createdBy', 'engineVersion', 'hash', 'id', 'kind', 'name', 'realizations', 'status', 'zonationId'].sort());
				// Other test files ask for review of and approve recipes of their own in the same project.
				expect(['ready', 'review', 'approved']).toContain(r.status);
				expect(r.hash).toMatch(/^[0-9a-f]{64}$/);
			}
		}
	});

	it('refuses without a session (401), with a bad token (401), and to a non-member (404)', async () => {
		expect((await new HttpSession(baseUrl).json('GET', base)).status).toBe(401);
		const bad = await new HttpSession(baseUrl).json('GET', base, undefined, { authorization: 'Bearer cf_not-a-token' });
		expect(bad.status).toBe(401);
		const foreign = await admin.json('GET', base);
		expect(foreign.status).toBe(404);
		expect((await errorOf(foreign)).code).toBe('not_found');
	});

	it('reads with a personal API token', async () => {
		const made = await viewer.json('POST', '/api/v1/account/tokens', { name: 'recipes test', expiresInDays: 7 });
		const { token } = await made.json();
		const res = await new HttpSession(baseUrl).json('GET', base, undefined, { authorization: `Bearer ${token}` });
		expect(res.status).toBe(200);
	});
});

describe('POST /api/v1/projects/:id/recipes', () => {
	it('an analyst creates a recipe (201); the same setup again is the stored recipe (200), even under another name', async () => {
		const first = await analyst.json('POST', base, setup());
		expect(first.status).toBe(201);
		const a = (await first.json()).recipe;
		expect(a.setup.seed).toBe('api-1');
		expect(a.provenance.zonation.name).toBe('Sand split at channel');
		const again = await analyst.json('POST', base, setup({ name: 'Some other name' }));
		expect(again.status).toBe(200);
		expect((await again.json()).recipe.id).toBe(a.id);
	});

	it('two concurrent creations of the same new setup store it once', async () => {
		const body = setup({ name: 'Concurrent', seed: 'api-concurrent' });
		const [x, y] = await Promise.all([analyst.json('POST', base, body), owner.json('POST', base, body)]);
		expect([x.status, y.status].sort()).toEqual([200, 201]);
		const [rx, ry] = [(await x.json()).recipe, (await y.json()).recipe];
		expect(rx.id).toBe(ry.id);
		const { recipes } = await (await viewer.json('GET', base)).json();
		expect(recipes.filter((r: { hash: string }) => r.hash === rx.hash)).toHaveLength(1);
	});

	it('refuses reviewers and viewers (403), a foreign origin (403), unreadable JSON (400) and a malformed setup (422)', async () => {
		for (const s of [viewer, reviewer]) {
			const res = await s.json('POST', base, setup({ seed: 'api-refused' }));
			expect(res.status).toBe(403);
			expect((await errorOf(res)).code).toBe('forbidden');
		}
		const foreign = await analyst.fetch(base, { method: 'POST', headers: { origin: 'http://evil.example', 'content-type': 'text/plain' }, body: JSON.stringify(setup()) });
		expect(foreign.status).toBe(403);
		const broken = await analyst.fetch(base, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"name": ' });
		expect(broken.status).toBe(400);
		const malformed = await analyst.json('POST', base, setup({ realizations: 501, grid: { geometry: '2d', chainage: { from: 5, to: 1, cell: 1 } } }));
		expect(malformed.status).toBe(422);
		const paths = (await errorOf(malformed)).issues!.map((i) => i.path.join('.'));
		expect(paths).toContain('realizations');
		expect(paths.some((p) => p.startsWith('grid'))).toBe(true);
	});

	it('a domain without a saved variogram is a 422 with an issue naming it', async () => {
		const units = (await (await analyst.json('GET', `/api/v1/projects/${demoId}/units`)).json()).units as { id: string; name: string }[];
		const z = await analyst.json('POST', `/api/v1/projects/${demoId}/zonations`, {
			name: 'Dense sand alone',
			domains: [{ name: 'Dense alone', property: 'qc1Ncs', members: [{ unitId: units.find((u) => u.name === 'Dense sand')!.id, zone: -1 }] }]
		});
		const { zonation: lone } = await z.json();
		const res = await analyst.json('POST', base, { ...setup(), zonationId: lone.id, domains: [{ domainId: lone.domains[0].id, simulate: true }] });
		expect(res.status).toBe(422);
		const err = await errorOf(res);
		expect(err.issues).toEqual([{ path: ['domains', 0, 'variogramId'], message: expect.stringMatching(/^Dense alone has no saved variogram/) }]);
		// The demo project is shared with the other test files: leave its zonations as they were.
		expect((await analyst.json('DELETE', `/api/v1/projects/${demoId}/zonations/${lone.id}`)).status).toBe(204);
	});
});

describe('GET /api/v1/projects/:id/recipes/:rid and recipe.json', () => {
	it('gives the recipe’s summary, setup and provenance to a viewer; 404 for an unknown id or a non-member', async () => {
		const r = await created(analyst, setup());
		const res = await viewer.json('GET', `${base}/${r.id}`);
		expect(res.status).toBe(200);
		const { recipe } = await res.json();
		expect(recipe.hash).toBe(r.hash);
		expect(recipe.provenance.domains.map((d: { name: string }) => d.name)).toEqual(zonation.domains.map((d) => d.name));
		expect((await viewer.json('GET', `${base}/nope`)).status).toBe(404);
		expect((await admin.json('GET', `${base}/${r.id}`)).status).toBe(404);
	});

	it('recipe.json is the canonical JSON whose SHA-256 (a stock implementation) is the hash', async () => {
		const r = await created(analyst, setup());
		const res = await viewer.fetch(`${base}/${r.id}/recipe.json`);
		expect(res.headers.get('content-type')).toMatch(/^application\/json/);
		const bytes = Buffer.from(await res.arrayBuffer());
		expect(createHash('sha256').update(bytes).digest('hex')).toBe(r.hash);
		expect(bytes.toString('utf8')).not.toMatch(/\s/);
		expect((await admin.fetch(`${base}/${r.id}/recipe.json`)).status).toBe(404);
	});
});

describe('GET …/realizations/:r', () => {
	it('JSON and Float64 bytes of realization r equal regenerate(recipe.json, r) in Node, bit for bit, twice alike', async () => {
		const r = await created(analyst, setup());
		const { recipe } = await recipeDocument(r.id);
		const here = regenerate(recipe, 3);
		const json = await (await viewer.json('GET', `${base}/${r.id}/realizations/3`)).json();
		expect(Object.keys(json).sort()).toEqual(['engineVersion', 'hash', 'realization', 'values']);
		expect([json.hash, json.realization, json.engineVersion]).toEqual([r.hash, 3, recipe.engineVersion]);
		expectSameBits(float64(json.values), here);
		expect(json.values.some((v: number | null) => v === null)).toBe(true);
		const bytes = async () => Buffer.from(await (await viewer.fetch(`${base}/${r.id}/realizations/3`, { headers: { accept: 'application/octet-stream' } })).arrayBuffer());
		const [b1, b2] = [await bytes(), await bytes()];
		expect(Buffer.compare(b1, b2)).toBe(0);
		expect(Buffer.compare(b1, Buffer.from(here.buffer))).toBe(0);
	}, 120_000);

	it('is 404 for r ≥ N and for a number that is not one', async () => {
		const r = await created(analyst, setup());
		for (const bad of ['4', '99', 'x', '-1', '1.5']) {
			const res = await viewer.json('GET', `${base}/${r.id}/realizations/${bad}`);
			expect(res.status, bad).toBe(404);
		}
	});
});

describe('GET …/summary', () => {
	it('the ensemble maps equal ensembleMap over regenerate(0 … N − 1) in Node, bit for bit, with the contract’s fields', async () => {
		const r = await created(analyst, setup());
		const { recipe } = await recipeDocument(r.id);
		const all = [0, 1, 2, 3].map((k) => regenerate(recipe, k));
		for (const [stat, threshold] of [['mean', null], ['sd', null], ['p10', null], ['p90', null], ['below', 100]] as const) {
			const res = await viewer.json('GET', `${base}/${r.id}/summary?stat=${stat}${threshold === null ? '' : `&threshold=${threshold}`}`);
			expect(res.status, stat).toBe(200);
			const body = await res.json();
			expect(Object.keys(body).sort()).toEqual(['hash', 'realizations', 'stat', 'threshold', 'values']);
			expect([body.hash, body.stat, body.threshold, body.realizations]).toEqual([r.hash, stat, threshold, 4]);
			expectSameBits(float64(body.values), ensembleMap(all, stat, threshold ?? undefined), stat);
		}
	}, 120_000);

	it('refuses an unknown stat and below without a threshold (422), and a non-member (404)', async () => {
		const r = await created(analyst, setup());
		expect((await viewer.json('GET', `${base}/${r.id}/summary?stat=mode`)).status).toBe(422);
		const res = await viewer.json('GET', `${base}/${r.id}/summary?stat=below`);
		expect(res.status).toBe(422);
		expect((await errorOf(res)).issues![0].path).toEqual(['threshold']);
		expect((await viewer.json('GET', `${base}/${r.id}/summary?stat=below&threshold=abc`)).status).toBe(422);
		expect((await admin.json('GET', `${base}/${r.id}/summary?stat=mean`)).status).toBe(404);
	});

	it('a simple GET answers while a summary of 20 realizations computes on the worker pool', async () => {
		const r = await created(analyst, setup({ name: 'Twenty', seed: 'api-twenty', realizations: 20, grid: { ...coarse, chainage: { from: 0, to: 400, cell: 2 }, elevation: { from: -12, to: 5, cell: 0.5 } } }));
		let summaryDone = false;
		const summary = viewer.json('GET', `${base}/${r.id}/summary?stat=p50`).then((res) => {
			summaryDone = true;
			return res;
		});
		await new Promise((done) => setTimeout(done, 300));
		const quick = await viewer.json('GET', `/api/v1/projects/${demoId}`);
		expect(quick.status).toBe(200);
		expect(summaryDone).toBe(false);
		expect((await summary).status).toBe(200);
	}, 300_000);
});

describe('DELETE /api/v1/projects/:id/recipes/:rid', () => {
	it('viewers and reviewers may not delete (403); an analyst deletes (204), then it is gone (404)', async () => {
		const r = await created(analyst, setup({ name: 'To delete', seed: 'api-delete' }));
		expect((await viewer.json('DELETE', `${base}/${r.id}`)).status).toBe(403);
		expect((await reviewer.json('DELETE', `${base}/${r.id}`)).status).toBe(403);
		expect((await admin.json('DELETE', `${base}/${r.id}`)).status).toBe(404);
		expect((await analyst.json('DELETE', `${base}/${r.id}`)).status).toBe(204);
		expect((await viewer.json('GET', `${base}/${r.id}`)).status).toBe(404);
		expect((await analyst.json('DELETE', `${base}/${r.id}`)).status).toBe(404);
	});
});
