/**
 * Contacts and tables out over HTTP against the built server: several contact edits at once (PATCH /contacts),
 * contacts interpolated for a sounding uploaded without them, the contacts and domain statistics as CSV, the
 * defaults a new domain starts with, and every refusal (role, other project, bad token, malformed input, tops
 * above the ground, concurrent edits of one contact).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');
const GEF_DIR = join(import.meta.dirname, '..', '..', 'static', 'demo', 'gef');

interface ContactJson {
	soundingId: string;
	soundingName: string;
	unitId: string;
	topElevation: number;
	interpolated: boolean;
}
interface ErrorJson {
	code: string;
	message: string;
	issues?: { path: (string | number)[]; message: string }[];
}

let analyst: HttpSession;
let viewer: HttpSession;
let demoId: string;
let ownId: string;
let ids: Record<string, string>;
let clay: string;
let sand: string;

const api = (id: string, path = '') => `/api/v1/projects/${id}${path}`;
async function ok<T>(res: Response, status = 200): Promise<T> {
	if (res.status !== status) expect.fail(`${res.status} ${await res.text()}`);
	return (res.status === 204 ? undefined : await res.json()) as T;
}
const errorOf = async (res: Response) => ((await res.json()) as { error: ErrorJson }).error;
const contacts = async () => (await ok<{ contacts: ContactJson[] }>(await analyst.json('GET', api(ownId, '/contacts')))).contacts;

async function upload(projectId: string, names: string[]) {
	const body = new FormData();
	for (const name of names) body.append('files', new Blob([readFileSync(join(GEF_DIR, name))]), name);
	return ok<{ interpolatedContacts: number }>(await analyst.fetch(api(projectId, '/soundings'), { method: 'POST', body }), 201);
}

beforeAll(async () => {
	analyst = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	viewer = await signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password);
	const { projects } = await ok<{ projects: { id: string; name: string }[] }>(await analyst.json('GET', '/api/v1/projects'));
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	ownId = (await ok<{ project: { id: string } }>(await analyst.json('POST', '/api/v1/projects', { name: 'Contacts API', description: '', lengthUnit: 'm' }), 201)).project.id;
	// The demo's section line, so the soundings' chainages are the demo's (LV-01 9.8 m, LV-05 70.8 m, LV-09 137 m).
	const { site } = await ok<{ site: { sectionLine: [number, number][] } }>(await analyst.json('GET', api(demoId, '/site')));
	await ok(await analyst.json('PATCH', api(ownId, '/site'), { sectionLine: site.sectionLine, groundwaterElevation: 2.5 }));
	await upload(ownId, ['LV-01.gef', 'LV-09.gef']);
	clay = (await ok<{ unit: { id: string } }>(await analyst.json('POST', api(ownId, '/units'), { name: 'Clay', property: 'suRatio' }), 201)).unit.id;
	sand = (await ok<{ unit: { id: string } }>(await analyst.json('POST', api(ownId, '/units'), { name: 'Sand', property: 'qc1Ncs' }), 201)).unit.id;
	const { soundings } = await ok<{ soundings: { id: string; name: string }[] }>(await analyst.json('GET', api(ownId, '/soundings')));
	ids = Object.fromEntries(soundings.map((s) => [s.name, s.id]));
});

describe('PATCH /contacts and interpolated contacts', () => {
	it('PATCH /contacts sets several tops at once and answers what changed with every contact', async () => {
		const res = await ok<{ changed: { set: number; removed: number; interpolated: number }; contacts: ContactJson[] }>(
			await analyst.json('PATCH', api(ownId, '/contacts'), {
				set: [
					{ soundingId: ids['LV-01'], unitId: sand, topElevation: 2.3 },
					{ soundingId: ids['LV-09'], unitId: sand, topElevation: 1.3 }
				]
			})
		);
		expect(res.changed).toEqual({ set: 2, removed: 0, interpolated: 0 });
		expect(res.contacts.map((c) => [c.soundingName, c.topElevation, c.interpolated])).toEqual([
			['LV-01', 2.3, false],
			['LV-09', 1.3, false]
		]);
		// The clay is the top unit: without a stored top it starts at the ground surface.
		const detail = await ok<{ units: { name: string; topElevation: number; topSource: string }[]; sounding: { groundElevation: number } }>(
			await analyst.json('GET', api(ownId, `/soundings/${ids['LV-01']}`))
		);
		expect(detail.units.map((u) => [u.name, u.topSource])).toEqual([
			['Clay', 'ground'],
			['Sand', 'measured']
		]);
		expect(detail.units[0].topElevation).toBe(detail.sounding.groundElevation);
	});

	it('a sounding uploaded without contacts takes them from its neighbours along chainage, flagged, and says so', async () => {
		const r = await upload(ownId, ['LV-05.gef']);
		expect(r.interpolatedContacts).toBe(1);
		const { soundings } = await ok<{ soundings: { id: string; name: string; contactsInterpolated: boolean; chainage: number }[] }>(
			await analyst.json('GET', api(ownId, '/soundings'))
		);
		const lv05 = soundings.find((s) => s.name === 'LV-05')!;
		ids['LV-05'] = lv05.id;
		expect(lv05.contactsInterpolated).toBe(true);
		expect(soundings.find((s) => s.name === 'LV-01')!.contactsInterpolated).toBe(false);
		const c = (await contacts()).find((x) => x.soundingName === 'LV-05')!;
		expect(c.interpolated).toBe(true);
		// Linear in chainage between LV-01 (9.8 m, 2.3) and LV-09 (137 m, 1.3), to the millimetre.
		const ch = (name: string) => soundings.find((s) => s.name === name)!.chainage;
		const expected = 2.3 + ((lv05.chainage - ch('LV-01')) / (ch('LV-09') - ch('LV-01'))) * (1.3 - 2.3);
		expect(Math.abs(c.topElevation - expected)).toBeLessThanOrEqual(0.0005); // rounded to 1 mm
	});

	it('an edit makes the contact measured; interpolate lets the sounding follow its neighbours again', async () => {
		await ok(await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: ids['LV-05'], unitId: sand, topElevation: 2.0 }));
		expect((await contacts()).find((x) => x.soundingName === 'LV-05')).toMatchObject({ topElevation: 2.0, interpolated: false });
		const back = await ok<{ changed: { interpolated: number } }>(await analyst.json('PATCH', api(ownId, '/contacts'), { interpolate: [ids['LV-05']] }));
		expect(back.changed.interpolated).toBe(1);
		expect((await contacts()).find((x) => x.soundingName === 'LV-05')!.interpolated).toBe(true);
	});

	it('PATCH /contacts writes nothing when one top lies above the ground surface (422 naming it)', async () => {
		const before = await contacts();
		const res = await analyst.json('PATCH', api(ownId, '/contacts'), {
			set: [
				{ soundingId: ids['LV-01'], unitId: sand, topElevation: 1 },
				{ soundingId: ids['LV-09'], unitId: clay, topElevation: 50 }
			]
		});
		expect(res.status).toBe(422);
		expect((await errorOf(res)).message).toMatch(/1 tops? lies? above the ground surface: Clay at LV-09: 50 .*Nothing was saved/);
		expect(await contacts()).toEqual(before);
	});

	it('PATCH /contacts refuses malformed bodies with 422 and the issues', async () => {
		for (const body of [{}, { set: [] }, { set: [{ soundingId: ids['LV-01'], unitId: sand, topElevation: 'high' }] }, { remove: 'all' }, { interpolate: [ids['LV-01']], extra: 1 }]) {
			const res = await analyst.json('PATCH', api(ownId, '/contacts'), body);
			expect(res.status, JSON.stringify(body)).toBe(422);
		}
		const many = Array.from({ length: 5001 }, () => ({ soundingId: ids['LV-01'], unitId: sand }));
		expect((await analyst.json('PATCH', api(ownId, '/contacts'), { remove: many })).status).toBe(422);
		const json = await analyst.fetch(api(ownId, '/contacts'), { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: '{"set":' });
		expect(json.status).toBe(400);
	});

	it('PATCH /contacts refuses ids of another project (404) and contradictions (422), writing nothing', async () => {
		const before = await contacts();
		const demoSounding = (await ok<{ soundings: { id: string }[] }>(await analyst.json('GET', api(demoId, '/soundings')))).soundings[0].id;
		const foreign = await analyst.json('PATCH', api(ownId, '/contacts'), { set: [{ soundingId: demoSounding, unitId: sand, topElevation: 0 }] });
		expect(foreign.status).toBe(404);
		const demoUnit = (await ok<{ units: { id: string }[] }>(await analyst.json('GET', api(demoId, '/units')))).units[0].id;
		expect((await analyst.json('PATCH', api(ownId, '/contacts'), { set: [{ soundingId: ids['LV-01'], unitId: demoUnit, topElevation: 0 }] })).status).toBe(404);
		const both = await analyst.json('PATCH', api(ownId, '/contacts'), {
			set: [{ soundingId: ids['LV-01'], unitId: sand, topElevation: 0 }],
			remove: [{ soundingId: ids['LV-01'], unitId: sand }]
		});
		expect(both.status).toBe(422);
		expect(await contacts()).toEqual(before);
	});

	it('PATCH /contacts is 403 for a viewer, 404 for a non-member, 401 without a session or with a bad token', async () => {
		const body = { set: [{ soundingId: ids['LV-01'], unitId: sand, topElevation: 0 }] };
		const demoBody = { interpolate: ['x'] };
		const asViewer = await viewer.json('PATCH', api(demoId, '/contacts'), demoBody);
		expect(asViewer.status).toBe(403);
		expect((await errorOf(asViewer)).code).toBe('forbidden');
		expect((await viewer.json('PATCH', api(ownId, '/contacts'), body)).status).toBe(404);
		expect((await new HttpSession(baseUrl).json('PATCH', api(ownId, '/contacts'), body)).status).toBe(401);
		const bearer = await fetch(new URL(api(ownId, '/contacts'), baseUrl), {
			method: 'PATCH',
			headers: { authorization: 'Bearer cf_not-a-real-token', 'content-type': 'application/json' },
			body: JSON.stringify(body)
		});
		expect(bearer.status).toBe(401);
	});

	it('two concurrent edits of one contact leave one stored contact with one of the two values', async () => {
		const put = (v: number) => analyst.json('PATCH', api(ownId, '/contacts'), { set: [{ soundingId: ids['LV-09'], unitId: sand, topElevation: v }] });
		const [a, b] = await Promise.all([put(1.1), put(1.2)]);
		expect([a.status, b.status]).toEqual([200, 200]);
		const mine = (await contacts()).filter((c) => c.soundingName === 'LV-09' && c.unitId === sand);
		expect(mine.length).toBe(1);
		expect([1.1, 1.2]).toContain(mine[0].topElevation);
	});
});

describe('tables out', () => {
	it('GET /contacts.csv downloads one row per sounding with each unit top and its source', async () => {
		const res = await analyst.fetch(api(ownId, '/contacts.csv'));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="Contacts-API-contacts.csv"');
		const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
		expect(rows.map((r) => r.sounding)).toEqual(['LV-01', 'LV-05', 'LV-09']);
		expect(rows.map((r) => [r['Clay source'], r['Sand source']])).toEqual([
			['ground', 'measured'],
			['ground', 'interpolated'],
			['ground', 'measured']
		]);
		expect(rows[0]['Sand top (m)']).toBe('2.300');
	});

	it('GET /contacts.csv is for members only: a viewer of the demo reads it, a non-member gets 404', async () => {
		expect((await viewer.fetch(api(demoId, '/contacts.csv'))).status).toBe(200);
		expect((await viewer.fetch(api(ownId, '/contacts.csv'))).status).toBe(404);
		expect((await new HttpSession(baseUrl).fetch(api(ownId, '/contacts.csv'), { headers: { accept: 'application/json' } })).status).toBe(401);
	});

	it('GET /domains/:did/statistics.csv gives the pooled and per-sounding statistics the samples endpoint computes', async () => {
		const { zonations } = await ok<{ zonations: { id: string; name: string; domains: { id: string; name: string }[] }[] }>(await viewer.json('GET', api(demoId, '/zonations')));
		const domain = zonations[0].domains.find((d) => d.name === 'Dense sand')!;
		const samples = await ok<{ stats: { n: number; mean: number; p50: number }; soundings: { name: string; n: number }[] }>(
			await viewer.json('GET', api(demoId, `/domains/${domain.id}/samples`))
		);
		const res = await viewer.fetch(api(demoId, `/domains/${domain.id}/statistics.csv`));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toMatch(/filename=".*Dense-sand-statistics\.csv"/);
		const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
		expect(rows[0]).toMatchObject({ soundings: 'all', n: String(samples.stats.n), weights: 'declustered, 40 m plan cells' });
		// qc1Ncs: one decimal in the catalogue, two for statistics.
		expect(rows[0]['mean of qc1Ncs']).toBe(samples.stats.mean.toFixed(2));
		expect(rows[0]['P50 of qc1Ncs']).toBe(samples.stats.p50.toFixed(2));
		expect(rows[1].weights).toBe('equal');
		expect(rows.slice(2).map((r) => [r.soundings, Number(r.n)])).toEqual(samples.soundings.map((s) => [s.name, s.n]));
		const shares = rows.slice(2).reduce((a, r) => a + Number(r['weight share (%)']), 0);
		expect(Math.abs(shares - 100)).toBeLessThanOrEqual(0.05 * rows.length); // each share rounded to 0.1 %
	});

	it('GET /zonations/:zid/statistics.csv lists every domain of the zonation; unknown ids and non-members get 404', async () => {
		const { zonations } = await ok<{ zonations: { id: string; name: string; domains: { name: string }[] }[] }>(await viewer.json('GET', api(demoId, '/zonations')));
		const res = await viewer.fetch(api(demoId, `/zonations/${zonations[0].id}/statistics.csv`));
		expect(res.status).toBe(200);
		const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
		expect(rows.map((r) => r.domain)).toEqual(zonations[0].domains.map((d) => d.name));
		expect(rows.every((r) => Number(r.n) > 0 && r['declustering cell'] === '40 m')).toBe(true);
		expect((await viewer.fetch(api(demoId, '/zonations/nope/statistics.csv'))).status).toBe(404);
		expect((await viewer.fetch(api(demoId, '/domains/nope/statistics.csv'))).status).toBe(404);
		expect((await viewer.fetch(api(ownId, `/zonations/${zonations[0].id}/statistics.csv`))).status).toBe(404);
	});
});

describe('domain defaults', () => {
	it('a domain created without settings starts with 0.2 m means and 40 m declustering cells', async () => {
		const { zonation } = await ok<{ zonation: { domains: { cellHeight: number; averaging: string; declusterCell: unknown }[] } }>(
			await analyst.json('POST', api(ownId, '/zonations'), { name: 'Defaults', domains: [{ name: 'Sand', property: 'qc1Ncs', members: [{ unitId: sand, zone: -1 }] }] }),
			201
		);
		expect(zonation.domains[0]).toMatchObject({ cellHeight: 0.2, averaging: 'mean', declusterCell: { x: 40, y: 40, z: null } });
	});
});
