/**
 * The per-project audit log over HTTP against the built server: who may read it (CAPABILITIES.readAudit: the
 * project's reviewers and owners; analysts and viewers are refused, as are outsiders), changes made over the API
 * appearing with who made them, the filters by kind and person, paging, the CSV download with the same filters
 * (parsed with csv-parse, with text a spreadsheet would run as a formula defused), malformed queries, and every
 * export download (realization CSV/VTK, maps, ZIP, an export job's file) recorded with who took which file.
 */
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';
import { CAPABILITIES, meets, type ProjectRole } from '../../src/lib/server/auth/roles';

const baseUrl = inject('baseUrl');
const ROLES = ['viewer', 'reviewer', 'analyst', 'owner'] as const satisfies readonly ProjectRole[];
const session = {} as Record<ProjectRole, HttpSession>;
let admin: HttpSession;
let projectId: string;
let log: string;
let userIds: Record<ProjectRole, string>;

interface Entry {
	id: number;
	at: string;
	user: { id: string | null; name: string } | null;
	kind: string;
	action: string;
	subject: string;
	subjectId: string | null;
	detail: string;
}

async function entries(query = ''): Promise<{ entries: Entry[]; next: number | null; people: { id: string; name: string }[] }> {
	const res = await session.owner.json('GET', `${log}${query}`);
	expect(res.status).toBe(200);
	return res.json();
}

async function csvRows(who: HttpSession, query = ''): Promise<string[][]> {
	const res = await who.fetch(`${log}.csv${query}`);
	expect(res.status).toBe(200);
	return parse(await res.text(), { relax_column_count: false });
}

beforeAll(async () => {
	const signed = await Promise.all(ROLES.map((r) => signedInSession(baseUrl, DEMO[r].email, DEMO[r].password)));
	ROLES.forEach((r, i) => (session[r] = signed[i]));
	admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
	const { projects } = (await (await session.viewer.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	log = `/api/v1/projects/${projectId}/audit`;
	const { members } = (await (await session.owner.json('GET', `/api/v1/projects/${projectId}/members`)).json()) as { members: { userId: string; email: string }[] };
	userIds = Object.fromEntries(ROLES.map((r) => [r, members.find((m) => m.email === DEMO[r].email)!.userId])) as Record<ProjectRole, string>;
}, 120_000);

describe('who may read the audit log (CAPABILITIES.readAudit)', () => {
	it('the JSON log, the CSV and the page: allowed for exactly the listed roles, 403 for the others', async () => {
		for (const role of ROLES) {
			const allowed = meets(role, CAPABILITIES.readAudit);
			const json = await session[role].json('GET', log);
			expect(json.status, `${role} json`).toBe(allowed ? 200 : 403);
			if (!allowed) expect((await json.json()).error.code).toBe('forbidden');
			expect((await session[role].fetch(`${log}.csv`)).status, `${role} csv`).toBe(allowed ? 200 : 403);
			const page = await session[role].fetch(`/projects/${projectId}/team/log`, { headers: { accept: 'text/html' } });
			expect(page.status, `${role} page`).toBe(allowed ? 200 : 403);
		}
		expect(ROLES.filter((r) => meets(r, CAPABILITIES.readAudit))).toEqual(['reviewer', 'owner']);
	});

	it('the Team page links to the log only for those who may read it', async () => {
		for (const role of ROLES) {
			const html = await (await session[role].fetch(`/projects/${projectId}/team`, { headers: { accept: 'text/html' } })).text();
			expect(html.includes('data-testid="audit-link"'), role).toBe(meets(role, CAPABILITIES.readAudit));
		}
	});

	it('refuses without a session (401), a bad token (401) and a non-member (404)', async () => {
		expect((await new HttpSession(baseUrl).json('GET', log)).status).toBe(401);
		expect((await new HttpSession(baseUrl).json('GET', log, undefined, { authorization: 'Bearer cf_bad' })).status).toBe(401);
		expect((await admin.json('GET', log)).status).toBe(404);
		expect((await admin.fetch(`${log}.csv`)).status).toBe(404);
	});

	it('a reviewer reads it with a personal API token too', async () => {
		const { token } = await (await session.reviewer.json('POST', '/api/v1/account/tokens', { name: 'audit test', expiresInDays: 7 })).json();
		expect((await new HttpSession(baseUrl).json('GET', log, undefined, { authorization: `Bearer ${token}` })).status).toBe(200);
	});
});

describe('entries, filters and the CSV', () => {
	let recipe: { id: string; name: string; hash: string };
	let unit: { id: string; name: string };
	const formula = `=HYPERLINK("http://evil.example","Sand ${crypto.randomUUID().slice(0, 6)}")`;

	beforeAll(async () => {
		const { zonations } = await (await session.viewer.json('GET', `/api/v1/projects/${projectId}/zonations`)).json();
		const zonation = zonations.find((z: { name: string }) => z.name === 'Sand grouped');
		const made = await session.analyst.json('POST', `/api/v1/projects/${projectId}/recipes`, {
			kind: 'uniform',
			name: `Audit baseline ${crypto.randomUUID().slice(0, 6)}`,
			zonationId: zonation.id,
			percentiles: [25, 75],
			grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1 } },
			domains: zonation.domains.map((d: { id: string }) => ({ domainId: d.id, simulate: true }))
		});
		expect(made.status).toBe(201);
		recipe = (await made.json()).recipe;
		// A unit whose name a spreadsheet would run as a formula, made and deleted by the owner.
		const u = await session.owner.json('POST', `/api/v1/projects/${projectId}/units`, { name: formula, property: 'qc1Ncs', position: 99 });
		expect(u.status).toBe(201);
		unit = (await u.json()).unit;
		expect((await session.owner.json('DELETE', `/api/v1/projects/${projectId}/units/${unit.id}`)).status).toBe(204);
	});

	it('records each change with who made it, newest first: the analyst’s recipe, the owner’s unit created then deleted', async () => {
		const { entries: newest } = await entries('?limit=10');
		const ids = newest.map((e) => e.id);
		expect(ids).toEqual([...ids].sort((a, b) => b - a));
		const mine = newest.filter((e) => e.subjectId === unit.id).map((e) => [e.kind, e.action, e.subject, e.user?.id]);
		expect(mine).toEqual([
			['unit', 'deleted', formula, userIds.owner],
			['unit', 'created', formula, userIds.owner]
		]);
		const created = newest.find((e) => e.subjectId === recipe.id)!;
		expect([created.kind, created.action, created.subject, created.user?.id]).toEqual(['recipe', 'created', recipe.name, userIds.analyst]);
		expect(created.detail).toContain(recipe.hash);
		expect(Math.abs(Date.parse(created.at) - Date.now())).toBeLessThan(5 * 60_000);
	});

	it('filters by kind and by person, together; people lists those who appear', async () => {
		const byKind = await entries('?kind=recipe&limit=1000');
		expect(byKind.entries.length).toBeGreaterThan(0);
		expect(new Set(byKind.entries.map((e) => e.kind))).toEqual(new Set(['recipe']));
		const byPerson = await entries(`?user=${userIds.owner}&limit=1000`);
		expect(new Set(byPerson.entries.map((e) => e.user?.id))).toEqual(new Set([userIds.owner]));
		const both = await entries(`?kind=unit&user=${userIds.owner}&limit=1000`);
		expect(both.entries.map((e) => e.id)).toEqual(byPerson.entries.filter((e) => e.kind === 'unit').map((e) => e.id));
		expect(both.entries.some((e) => e.subjectId === unit.id)).toBe(true);
		expect((await entries(`?kind=recipe&user=${userIds.viewer}`)).entries).toEqual([]);
		expect(byKind.people.map((p) => p.id)).toEqual(expect.arrayContaining([userIds.owner, userIds.analyst]));
	});

	it('pages back in time with limit and next, without gaps or repeats', async () => {
		const all = (await entries('?limit=1000')).entries.map((e) => e.id);
		const first = await entries('?limit=3');
		expect(first.entries.map((e) => e.id)).toEqual(all.slice(0, 3));
		expect(first.next).toBe(all[2]);
		const second = await entries(`?limit=3&before=${first.next}`);
		expect(second.entries.map((e) => e.id)).toEqual(all.slice(3, 6));
	});

	it('the CSV holds every entry of the filter as the JSON does, newest first, with a formula defused', async () => {
		const rows = await csvRows(session.reviewer);
		expect(rows[0]).toEqual(['time (UTC)', 'person', 'kind', 'action', 'subject', 'detail']);
		const json = (await entries('?limit=1000')).entries;
		expect(rows.length - 1).toBe(json.length);
		expect(rows.slice(1).map((r) => r[0])).toEqual(json.map((e) => e.at));
		const deleted = rows.find((r) => r[3] === 'deleted' && r[4].includes(formula))!;
		expect(deleted[4]).toBe(`'${formula}`);
		expect(deleted[2]).toBe('Units');
		const recipes = await csvRows(session.owner, `?kind=recipe&user=${userIds.analyst}`);
		expect(recipes.length).toBeGreaterThan(1);
		expect(new Set(recipes.slice(1).map((r) => r[2]))).toEqual(new Set(['Recipes']));
		expect(recipes.slice(1).some((r) => r[3] === 'created' && r[4] === recipe.name)).toBe(true);
		const res = await session.owner.fetch(`${log}.csv`);
		expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
		expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="Riverside-levee-demo-audit-log\.csv"$/);
		await res.body?.cancel();
	});

	it('refuses an unknown kind, a limit out of range and a before that is not an entry id (422 naming the field)', async () => {
		for (const [q, field] of [
			['?kind=nope', 'kind'],
			['?limit=0', 'limit'],
			['?limit=1001', 'limit'],
			['?before=abc', 'before']
		]) {
			const res = await session.owner.json('GET', `${log}${q}`);
			expect(res.status, q).toBe(422);
			expect((await res.json()).error.issues.map((i: { path: string[] }) => i.path.join('.')), q).toEqual([field]);
		}
		expect((await session.owner.fetch(`${log}.csv?kind=nope`)).status).toBe(422);
	});
});

describe('export downloads are recorded (kind export, action downloaded)', () => {
	let recipe: { id: string; name: string; hash: string };
	let rbase: string;

	beforeAll(async () => {
		const { zonations } = await (await session.viewer.json('GET', `/api/v1/projects/${projectId}/zonations`)).json();
		const zonation = zonations.find((z: { name: string }) => z.name === 'Sand split at channel');
		const made = await session.analyst.json('POST', `/api/v1/projects/${projectId}/recipes`, {
			name: `Audit downloads ${crypto.randomUUID().slice(0, 6)}`,
			zonationId: zonation.id,
			seed: 'audit-downloads',
			realizations: 2,
			grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1 } },
			domains: zonation.domains.map((d: { id: string }) => ({ domainId: d.id, simulate: true }))
		});
		recipe = (await made.json()).recipe;
		rbase = `/api/v1/projects/${projectId}/recipes/${recipe.id}`;
	}, 120_000);

	async function downloadsOf(role: ProjectRole): Promise<Entry[]> {
		return (await entries(`?kind=export&user=${userIds[role]}&limit=1000`)).entries.filter((e) => e.subjectId === recipe.id);
	}

	it('each download a viewer makes is one entry naming the viewer, the recipe, the file and the hash; a refused one none', async () => {
		const files: [string, RegExp][] = [
			[`${rbase}/realizations/1.csv`, /_r1\.csv$/],
			[`${rbase}/realizations/0.vtk`, /_r0\.vtk$/],
			[`${rbase}/maps.csv?stats=mean,sd`, /_maps\.csv$/],
			[`${rbase}/maps.vtk`, /_maps\.vtk$/],
			[`${rbase}/export.zip?realizations=0-1&format=csv`, /\.zip$/]
		];
		for (const [url] of files) {
			const res = await session.viewer.fetch(url);
			expect(res.status, url).toBe(200);
			await res.arrayBuffer();
		}
		expect((await session.viewer.fetch(`${rbase}/realizations/7.csv`)).status).toBe(404);
		expect((await session.viewer.fetch(`${rbase}/maps.csv?stats=below`)).status).toBe(422);
		const got = await downloadsOf('viewer');
		expect(got).toHaveLength(files.length);
		// Newest first: the entries are the downloads in reverse order.
		got.reverse().forEach((e, k) => {
			expect([e.kind, e.action, e.subject, e.user?.id]).toEqual(['export', 'downloaded', recipe.name, userIds.viewer]);
			expect(e.detail.split('; ')[0], files[k][0]).toMatch(files[k][1]);
			expect(e.detail).toContain(`SHA-256 ${recipe.hash}`);
		});
	});

	it('the download of an export job’s file is recorded too, by whoever takes it', async () => {
		const started = await session.owner.json('POST', `/api/v1/projects/${projectId}/exports`, { recipeId: recipe.id, realizations: '0-1', format: 'csv' });
		expect(started.status).toBe(202);
		let job = (await started.json()).export;
		for (let i = 0; i < 300 && job.status !== 'done'; i++) {
			await new Promise((r) => setTimeout(r, 100));
			job = (await (await session.owner.json('GET', `/api/v1/projects/${projectId}/exports/${job.id}`)).json()).export;
		}
		expect(job.status).toBe('done');
		const before = (await downloadsOf('reviewer')).length;
		const file = await session.reviewer.fetch(`/api/v1/projects/${projectId}/exports/${job.id}/download`);
		expect(file.status).toBe(200);
		await file.arrayBuffer();
		const got = await downloadsOf('reviewer');
		expect(got).toHaveLength(before + 1);
		expect(got[0].detail).toBe(`${job.fileName}; SHA-256 ${recipe.hash}`);
	}, 120_000);

	it('the CSV lists them under Exports', async () => {
		const rows = await csvRows(session.owner, `?kind=export&user=${userIds.viewer}`);
		expect(rows.slice(1).filter((r) => r[4] === recipe.name).map((r) => [r[2], r[3]])).toEqual(new Array(5).fill(['Exports', 'downloaded']));
	});
});

