/**
 * Saved variograms over HTTP on loopback against the built server: analysts save and restore, reviewers
 * comment, viewers read (the routes guard with CAPABILITIES of src/lib/server/auth/roles.ts); refusals in the API's
 * error shape (403 for a role below the action, 404 for another project's or an unknown domain, 400 for a
 * body that is not JSON, 422 for one that does not match the schema).
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');

let analyst: HttpSession;
let reviewer: HttpSession;
let viewer: HttpSession;
let demoId: string;
let domainId: string;
let path: string;

const body = (name: string, rangeMajor = 40) => ({
	name,
	model: {
		azimuth: 0,
		structures: [
			{ type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
			{ type: 'exponential', sill: 0.9, rangeMajor, rangeMinor: rangeMajor, rangeVertical: 0.8 }
		]
	},
	settings: {
		transform: 'normal-score',
		declustered: true,
		vertical: { lag: 0.1, nLags: 20, lagTolerance: 0.05 },
		horizontal: { lag: 10, nLags: 12, lagTolerance: 5, verticalBand: 0.1, azimuth: null, angleTolerance: 22.5 },
		minPairs: 30,
		fit: { type: 'exponential', nugget: 'fit' }
	},
	misfit: 4.25,
	note: 'integration test'
});

async function errorOf(res: Response) {
	return ((await res.json()) as { error: { code: string; message: string; issues?: { path: unknown[] }[] } }).error;
}

beforeAll(async () => {
	[analyst, reviewer, viewer] = await Promise.all([
		signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password),
		signedInSession(baseUrl, DEMO.reviewer.email, DEMO.reviewer.password),
		signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password)
	]);
	const { projects } = (await (await analyst.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	const { zonations } = (await (await viewer.json('GET', `/api/v1/projects/${demoId}/zonations`)).json()) as {
		zonations: { domains: { id: string }[] }[];
	};
	domainId = zonations.flatMap((z) => z.domains)[0].id;
	path = `/api/v1/projects/${demoId}/domains/${domainId}/variograms`;
});

describe('POST/GET /api/v1/projects/[id]/domains/[did]/variograms', () => {
	it('an analyst saves versions 1 and 2 of a name; a viewer reads the history with who and when', async () => {
		const a = await analyst.json('POST', path, body('HTTP exponential'));
		expect(a.status).toBe(201);
		const v1 = (await a.json()).variogram;
		expect(v1).toMatchObject({ name: 'HTTP exponential', version: 1, misfit: 4.25, note: 'integration test', createdBy: { name: 'Ana Analyst' } });
		const v2 = (await (await analyst.json('POST', path, body('HTTP exponential', 80))).json()).variogram;
		expect(v2.version).toBe(2);
		const res = await viewer.json('GET', path);
		expect(res.status).toBe(200);
		const { variograms } = await res.json();
		const mine = variograms.filter((v: { name: string }) => v.name === 'HTTP exponential');
		expect(mine.map((v: { version: number }) => v.version).sort()).toEqual([1, 2]);
		expect(mine.find((v: { version: number }) => v.version === 2).model.structures[1].rangeMajor).toBe(80);
		const one = await viewer.json('GET', `${path}/${v1.id}`);
		expect(one.status).toBe(200);
		expect((await one.json()).variogram.settings.vertical).toEqual({ lag: 0.1, nLags: 20, lagTolerance: 0.05 });
	});

	it('viewers and reviewers may not save (403); anonymous callers get 401', async () => {
		for (const s of [viewer, reviewer]) {
			const res = await s.json('POST', path, body('Not allowed'));
			expect(res.status).toBe(403);
			expect(await errorOf(res)).toMatchObject({ code: 'forbidden' });
		}
		expect((await new HttpSession(baseUrl).json('GET', path)).status).toBe(401);
	});

	it('a body that is not JSON answers 400; an invalid model answers 422 naming the field', async () => {
		const broken = await analyst.fetch(path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"name": ' });
		expect(broken.status).toBe(400);
		expect(await errorOf(broken)).toMatchObject({ code: 'bad_request' });
		const bad = body('Bad');
		bad.model.structures[1].rangeVertical = 0;
		const res = await analyst.json('POST', path, bad);
		expect(res.status).toBe(422);
		const err = await errorOf(res);
		expect(err.issues!.some((i) => i.path.join('.').startsWith('model.structures.1'))).toBe(true);
		const unnamed = await analyst.json('POST', path, { ...body(''), name: '  ' });
		expect(unnamed.status).toBe(422);
	});

	it('an unknown domain or variogram answers 404', async () => {
		expect((await analyst.json('POST', `/api/v1/projects/${demoId}/domains/nope/variograms`, body('X'))).status).toBe(404);
		expect((await viewer.json('GET', `${path}/nope`)).status).toBe(404);
		expect((await viewer.json('GET', `/api/v1/projects/nope/domains/${domainId}/variograms`)).status).toBe(404);
	});
});

describe('comments and restore', () => {
	it('a reviewer comments, a viewer reads the comments but may not post (403)', async () => {
		const v = (await (await analyst.json('POST', path, body('HTTP commented'))).json()).variogram;
		const c = await reviewer.json('POST', `${path}/${v.id}/comments`, { body: 'Horizontal range rests on few bins.' });
		expect(c.status).toBe(201);
		expect((await c.json()).comment).toMatchObject({ body: 'Horizontal range rests on few bins.', author: { name: 'Rui Reviewer' } });
		const list = await viewer.json('GET', `${path}/${v.id}/comments`);
		expect((await list.json()).comments.map((x: { body: string }) => x.body)).toEqual(['Horizontal range rests on few bins.']);
		expect((await viewer.json('POST', `${path}/${v.id}/comments`, { body: 'me too' })).status).toBe(403);
		expect((await reviewer.json('POST', `${path}/${v.id}/comments`, { body: '   ' })).status).toBe(422);
		expect((await (await viewer.json('GET', `${path}/${v.id}`)).json()).variogram.comments).toBe(1);
	});

	it('an analyst restores version 1 as version 3 with its parameters; a reviewer may not (403)', async () => {
		const v1 = (await (await analyst.json('POST', path, body('HTTP restore', 30))).json()).variogram;
		await analyst.json('POST', path, body('HTTP restore', 90));
		expect((await reviewer.json('POST', `${path}/${v1.id}/restore`)).status).toBe(403);
		const res = await analyst.json('POST', `${path}/${v1.id}/restore`);
		expect(res.status).toBe(201);
		const v3 = (await res.json()).variogram;
		expect(v3).toMatchObject({ name: 'HTTP restore', version: 3, note: 'Restored from version 1.' });
		expect(v3.model).toEqual(v1.model);
		expect(v3.settings).toEqual(v1.settings);
		const noted = await analyst.json('POST', `${path}/${v1.id}/restore`, { note: 'Short range again' });
		expect((await noted.json()).variogram).toMatchObject({ version: 4, note: 'Short range again' });
	});
});
