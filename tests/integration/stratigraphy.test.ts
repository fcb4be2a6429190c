/**
 * Site, stratigraphy, zonations and domain samples over HTTP against the built server: CRUD in a project of
 * the analyst's own, the seeded demo's two zonations and its domain samples (the contract in notes/SITE.md),
 * role checks (viewer reads, analyst writes, non-members get 404) and validation errors (400/409/422).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');
const DEMO_DIR = join(import.meta.dirname, '..', '..', 'static', 'demo');

interface ErrorJson {
	code: string;
	message: string;
	issues?: { path: (string | number)[]; message: string }[];
}
interface UnitJson {
	id: string;
	name: string;
	colour: string;
	position: number;
	zoneNames: string[];
}

let analyst: HttpSession;
let viewer: HttpSession;
let demoId: string;
let ownId: string;
let soundingIds: string[];

const api = (id: string, path = '') => `/api/v1/projects/${id}${path}`;
async function errorOf(res: Response): Promise<ErrorJson> {
	return ((await res.json()) as { error: ErrorJson }).error;
}
async function ok<T>(res: Response, status = 200): Promise<T> {
	if (res.status !== status) expect.fail(`${res.status} ${await res.text()}`);
	return (res.status === 204 ? undefined : await res.json()) as T;
}

beforeAll(async () => {
	analyst = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	viewer = await signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password);
	const { projects } = await ok<{ projects: { id: string; name: string }[] }>(await analyst.json('GET', '/api/v1/projects'));
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	ownId = (await ok<{ project: { id: string } }>(await analyst.json('POST', '/api/v1/projects', { name: 'Strat API', description: '', lengthUnit: 'm' }), 201)).project.id;
	// Two demo soundings, so contacts have somewhere to go.
	const body = new FormData();
	for (const name of ['LV-01.gef', 'LV-20.gef']) body.append('files', new Blob([readFileSync(join(DEMO_DIR, 'gef', name))]), name);
	await ok(await analyst.fetch(api(ownId, '/soundings'), { method: 'POST', body }), 201);
	const { soundings } = await ok<{ soundings: { id: string; name: string }[] }>(await analyst.json('GET', api(ownId, '/soundings')));
	soundingIds = soundings.map((s) => s.id);
});

describe('site, units, contacts and zone boundaries', () => {
	it('PATCH /site stores the section line and groundwater; GET returns them', async () => {
		const { site } = await ok<{ site: Record<string, unknown> }>(
			await analyst.json('PATCH', api(ownId, '/site'), { sectionLine: [[512000, 4183000], [512346.41, 4183200]], groundwaterElevation: 2.5 })
		);
		expect(site).toMatchObject({ geometry: '2d', groundwaterElevation: 2.5, offLineTolerance: 25, lengthUnit: 'm' });
		const { soundings } = await ok<{ soundings: { chainage: number; chainageSource: string }[] }>(await analyst.json('GET', api(ownId, '/soundings')));
		// LV-01 lies at chainage 9.8 m of the demo line (scenario: 8 + 1.8).
		expect(soundings[0].chainage).toBeCloseTo(9.8, 1); // ±0.05 m
	});

	it('POST, PATCH and DELETE /units keep the stacking order and colours', async () => {
		const clay = await ok<{ unit: UnitJson }>(await analyst.json('POST', api(ownId, '/units'), { name: 'Clay', property: 'suRatio' }), 201);
		const sand = await ok<{ unit: UnitJson }>(await analyst.json('POST', api(ownId, '/units'), { name: 'Sand', gammaBelow: 19.5, property: 'qc1Ncs' }), 201);
		expect(clay.unit.position).toBe(0);
		expect(sand.unit.position).toBe(1);
		expect(clay.unit.colour).toMatch(/^#[0-9a-f]{6}$/);
		const peat = await ok<{ unit: UnitJson }>(await analyst.json('POST', api(ownId, '/units'), { name: 'Peat', position: 0, colour: '#5A4A3A', property: 'suRatio' }), 201);
		expect(peat.unit.colour).toBe('#5a4a3a');
		await ok(await analyst.json('PATCH', api(ownId, `/units/${peat.unit.id}`), { position: 2 }));
		const list = await ok<{ units: UnitJson[] }>(await analyst.json('GET', api(ownId, '/units')));
		expect(list.units.map((u) => u.name)).toEqual(['Clay', 'Sand', 'Peat']);
		await ok(await analyst.json('DELETE', api(ownId, `/units/${peat.unit.id}`)), 204);
		expect((await analyst.json('GET', api(ownId, `/units/${peat.unit.id}`))).status).toBe(404);
	});

	it('PUT /contacts sets a top, GET lists it, DELETE removes it; the derived sounding follows', async () => {
		const { units } = await ok<{ units: UnitJson[] }>(await analyst.json('GET', api(ownId, '/units')));
		const [clay, sand] = units;
		await ok(await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[0], unitId: clay.id, topElevation: 3.96 }));
		await ok(await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[0], unitId: sand.id, topElevation: 2.0 }));
		await ok(await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[0], unitId: sand.id, topElevation: 2.3 }));
		await ok(await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[1], unitId: sand.id, topElevation: 1.0 }));
		const { contacts } = await ok<{ contacts: { soundingId: string; unitId: string; topElevation: number }[] }>(await analyst.json('GET', api(ownId, '/contacts')));
		expect(contacts.filter((c) => c.soundingId === soundingIds[0]).map((c) => c.topElevation)).toEqual([3.96, 2.3]);
		const detail = await ok<{ units: { name: string; topElevation: number | null }[] }>(await analyst.json('GET', api(ownId, `/soundings/${soundingIds[0]}`)));
		expect(detail.units.map((u) => u.topElevation)).toEqual([3.96, 2.3]);
		await ok(await analyst.json('DELETE', api(ownId, '/contacts'), { soundingId: soundingIds[1], unitId: sand.id }), 204);
		expect((await analyst.json('DELETE', api(ownId, '/contacts'), { soundingId: soundingIds[1], unitId: sand.id })).status).toBe(404);
		await ok(await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[1], unitId: sand.id, topElevation: 1.0 }));
	});

	it('POST /zone-boundaries splits a unit into named zones; PUT moves it; the unit lists its zones', async () => {
		const { units } = await ok<{ units: UnitJson[] }>(await analyst.json('GET', api(ownId, '/units')));
		const sand = units[1];
		await ok(await analyst.json('PATCH', api(ownId, `/units/${sand.id}`), { zoneNames: ['West', 'East'] }));
		const { boundary } = await ok<{ boundary: { id: string } }>(
			await analyst.json('POST', api(ownId, '/zone-boundaries'), { unitId: sand.id, chainageTop: 200, elevationTop: 5, chainageBottom: 200, elevationBottom: -12 }),
			201
		);
		await ok(await analyst.json('PUT', api(ownId, '/zone-boundaries'), { id: boundary.id, unitId: sand.id, chainageTop: 205, elevationTop: 5, chainageBottom: 210, elevationBottom: -12 }));
		const after = await ok<{ units: UnitJson[] }>(await analyst.json('GET', api(ownId, '/units')));
		expect(after.units[1].zoneNames).toEqual(['West', 'East']);
		const { boundaries } = await ok<{ boundaries: { chainageBottom: number }[] }>(await viewer.json('GET', api(demoId, '/zone-boundaries')));
		expect(boundaries.length).toBe(1);
	});

	it('GET /section draws the located soundings with the chosen property', async () => {
		const s = await ok<{ soundings: { name: string; chainage: number; value: (number | null)[] }[]; property: { key: string }; contacts: unknown[] }>(
			await analyst.json('GET', api(ownId, '/section?property=Ic'))
		);
		expect(s.property.key).toBe('Ic');
		expect(s.soundings.map((x) => x.name)).toEqual(['LV-01', 'LV-20']);
		expect(s.soundings[0].value.some((v) => v !== null)).toBe(true);
		expect(s.contacts.length).toBe(2);
	});
});

describe('zonations, domains and samples', () => {
	it('POST /zonations with domains, POST a domain to it, PATCH its members and cell; samples follow', async () => {
		const { units } = await ok<{ units: UnitJson[] }>(await analyst.json('GET', api(ownId, '/units')));
		const [clay, sand] = units;
		const { zonation } = await ok<{ zonation: { id: string; domains: { id: string; name: string }[] } }>(
			await analyst.json('POST', api(ownId, '/zonations'), {
				name: 'Split',
				domains: [
					{ name: 'Clay', property: 'suRatio', members: [{ unitId: clay.id, zone: -1 }] },
					{ name: 'West sand', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: 0 }] }
				]
			}),
			201
		);
		const { domain } = await ok<{ domain: { id: string } }>(await analyst.json('POST', api(ownId, `/zonations/${zonation.id}`), { name: 'East sand', property: 'qc1Ncs' }), 201);
		await ok(
			await analyst.json('PATCH', api(ownId, `/domains/${domain.id}`), {
				members: [{ unitId: sand.id, zone: 1 }],
				cellHeight: 0.25,
				averaging: 'median',
				declusterCell: { x: 50, y: 50, z: null }
			})
		);
		const east = await ok<{
			domain: { name: string; zonationName: string; averaging: string };
			property: { key: string; label: string; unit: string };
			samples: { x: number[]; y: number[]; z: number[]; value: number[]; sounding: string[] };
			weights: number[];
			stats: { n: number; mean: number };
			soundings: { name: string }[];
		}>(await analyst.json('GET', api(ownId, `/domains/${domain.id}/samples`)));
		expect(east.domain).toMatchObject({ name: 'East sand', zonationName: 'Split', averaging: 'median' });
		expect(east.soundings.map((s) => s.name)).toEqual(['LV-20']);
		expect(east.samples.x.every((c) => c > 205)).toBe(true);
		expect(east.weights.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12); // weights sum to 1 within 1e-12
		expect(east.stats.n).toBe(east.samples.value.length);
		const west = await ok<{ soundings: { name: string }[] }>(await analyst.json('GET', api(ownId, `/domains/${zonation.domains[1].id}/samples`)));
		expect(west.soundings.map((s) => s.name)).toEqual(['LV-01']);
	});

	it('a unit or zone in two domains of one zonation is a 409; a zone the unit lacks is a 422', async () => {
		const { zonations } = await ok<{ zonations: { id: string; domains: { id: string; members: { unitId: string; zone: number }[] }[] }[] }>(
			await analyst.json('GET', api(ownId, '/zonations'))
		);
		const z = zonations[0];
		const sandId = z.domains[1].members[0].unitId;
		const clash = await analyst.json('PATCH', api(ownId, `/domains/${z.domains[2].id}`), { members: [{ unitId: sandId, zone: -1 }] });
		expect(clash.status).toBe(409);
		expect((await errorOf(clash)).message).toMatch(/at most one domain|already belongs/);
		const bad = await analyst.json('PATCH', api(ownId, `/domains/${z.domains[2].id}`), { members: [{ unitId: sandId, zone: 5 }] });
		expect(bad.status).toBe(422);
	});

	it('PATCH /domains/[did] {rules} saves the conditioning rules; the samples keep only what they allow and count the rest', async () => {
		const { zonations } = await ok<{ zonations: { id: string; domains: { id: string; name: string }[] }[] }>(await analyst.json('GET', api(ownId, '/zonations')));
		const west = zonations[0].domains.find((d) => d.name === 'West sand')!;
		type Samples = { counts: Record<string, number>; samples: { z: number[] }; soundings: { name: string }[]; leftOut: { name: string; reason: string }[] };
		// Every reading a sample (no averaging), so the counts of readings and the samples can be compared one to one.
		expect((await analyst.json('PATCH', api(ownId, `/domains/${west.id}`), { cellHeight: null })).status).toBe(200);
		const before = await ok<Samples>(await analyst.json('GET', api(ownId, `/domains/${west.id}/samples`)));
		expect(before.counts.kept).toBe(before.samples.z.length);
		const rules = { contactBuffer: 0.3, minDepth: 0, minSigmaVeff: 0, excludedSoundings: [], flagged: 'exclude' };
		const { domain } = await ok<{ domain: { rules: unknown } }>(await analyst.json('PATCH', api(ownId, `/domains/${west.id}`), { rules }));
		expect(domain.rules).toEqual(rules);
		const after = await ok<Samples>(await analyst.json('GET', api(ownId, `/domains/${west.id}/samples`)));
		expect(after.counts.readings).toBe(before.counts.readings);
		expect(after.counts.contactBuffer).toBeGreaterThan(0);
		expect(after.counts.kept).toBe(after.samples.z.length);
		expect(after.counts.kept + after.counts.noValue + after.counts.contactBuffer + after.counts.flagged).toBe(after.counts.readings);
		const stressed = await ok<Samples>(
			await analyst.json('PATCH', api(ownId, `/domains/${west.id}`), { rules: { ...rules, minSigmaVeff: 60 } }).then(() => analyst.json('GET', api(ownId, `/domains/${west.id}/samples`)))
		);
		expect(stressed.counts.minSigmaVeff).toBeGreaterThan(0);
		expect(stressed.counts.kept).toBeLessThan(after.counts.kept);
		const gone = await ok<Samples>(await analyst.json('PATCH', api(ownId, `/domains/${west.id}`), { rules: { ...rules, excludedSoundings: ['LV-01'] } }).then(() =>
			analyst.json('GET', api(ownId, `/domains/${west.id}/samples`))
		));
		expect(gone.samples.z).toEqual([]);
		expect(gone.leftOut).toEqual([{ name: 'LV-01', reason: 'excluded' }]);
	});

	it('PATCH {rules} refuses a viewer (403), bad rules (422), an unknown sounding (422) and another project (404)', async () => {
		const { zonations } = await ok<{ zonations: { domains: { id: string }[] }[] }>(await analyst.json('GET', api(ownId, '/zonations')));
		const id = zonations[0].domains[0].id;
		const good = { contactBuffer: 0, minDepth: 1, minSigmaVeff: 0, excludedSoundings: [], flagged: 'keep' };
		const { zonations: demo } = await ok<{ zonations: { domains: { id: string }[] }[] }>(await viewer.json('GET', api(demoId, '/zonations')));
		expect((await viewer.json('PATCH', api(demoId, `/domains/${demo[0].domains[0].id}`), { rules: good })).status).toBe(403);
		const negative = await analyst.json('PATCH', api(ownId, `/domains/${id}`), { rules: { ...good, contactBuffer: -1 } });
		expect(negative.status).toBe(422);
		expect((await errorOf(negative)).issues?.[0].path).toEqual(['rules', 'contactBuffer']);
		expect((await analyst.json('PATCH', api(ownId, `/domains/${id}`), { rules: { ...good, flagged: 'maybe' } })).status).toBe(422);
		expect((await analyst.json('PATCH', api(ownId, `/domains/${id}`), { rules: { ...good, extra: 1 } })).status).toBe(422);
		const unknown = await analyst.json('PATCH', api(ownId, `/domains/${id}`), { rules: { ...good, excludedSoundings: ['LV-99'] } });
		expect(unknown.status).toBe(422);
		expect((await errorOf(unknown)).message).toBe('No sounding named LV-99 in this project.');
		expect((await viewer.json('PATCH', api(ownId, `/domains/${id}`), { rules: good })).status).toBe(404);
	});
});

describe('the seeded demo project', () => {
	it('GET /zonations answers the contract shape with both demo zonations, for a viewer', async () => {
		const { zonations } = await ok<{
			zonations: { id: string; name: string; description: string; domains: { id: string; name: string; property: string; members: { unitId: string; unitName: string; zone: number; zoneName: string }[] }[] }[];
		}>(await viewer.json('GET', api(demoId, '/zonations')));
		expect(zonations.map((z) => z.name)).toEqual(['Sand split at channel', 'Sand grouped']);
		const west = zonations[0].domains.find((d) => d.name === 'Point-bar sand west')!;
		expect(west.members).toMatchObject([{ unitName: 'Point-bar sand', zone: 0, zoneName: 'West' }]);
		expect(zonations[1].domains.find((d) => d.name === 'Point-bar sand')!.members[0].zone).toBe(-1);
	});

	it('GET /domains/[did]/samples answers every field of the contract', async () => {
		const { zonations } = await ok<{ zonations: { domains: { id: string; name: string }[] }[] }>(await viewer.json('GET', api(demoId, '/zonations')));
		const id = zonations[0].domains.find((d) => d.name === 'Point-bar sand east')!.id;
		// eslint-disable-next-line @typescript-eslint/no-explicit-any -- the contract is checked key by key below
		const s = await ok<Record<string, any>>(await viewer.json('GET', api(demoId, `/domains/${id}/samples`)));
		expect(Object.keys(s).sort()).toEqual(['cdf', 'counts', 'domain', 'geometry', 'leftOut', 'lengthUnit', 'property', 'samples', 'soundings', 'stats', 'warnings', 'weights'].sort());
		expect(Object.keys(s.domain).sort()).toEqual(['averaging', 'cellHeight', 'declusterCell', 'id', 'name', 'property', 'rules', 'zonationId', 'zonationName'].sort());
		expect(Object.keys(s.counts).sort()).toEqual(['contactBuffer', 'flagged', 'kept', 'minDepth', 'minSigmaVeff', 'noValue', 'readings', 'sounding'].sort());
		expect(s.property).toEqual({ key: 'qc1Ncs', label: 'qc1Ncs', unit: '–' });
		expect(s.geometry).toBe('2d');
		const n = s.samples.value.length;
		for (const k of ['x', 'y', 'z', 'sounding']) expect(s.samples[k].length).toBe(n);
		expect(s.weights.length).toBe(n);
		expect(s.samples.y.every((v: number) => v === 0)).toBe(true);
		expect(Object.keys(s.stats).sort()).toEqual(['mean', 'n', 'p10', 'p50', 'p90', 'sd']);
		expect(s.stats.p10).toBeLessThan(s.stats.p50);
		expect(s.stats.p50).toBeLessThan(s.stats.p90);
		expect(s.cdf.value.length).toBe(s.cdf.p.length);
		expect(s.soundings[0]).toHaveProperty('cdf.value');
	});
});

describe('roles and validation', () => {
	it('a viewer reads but may not write: 403 on POST /units, PUT /contacts, PATCH /site, POST /zonations', async () => {
		expect((await viewer.json('GET', api(demoId, '/units'))).status).toBe(200);
		expect((await viewer.json('GET', api(demoId, '/site'))).status).toBe(200);
		for (const [method, path, body] of [
			['POST', '/units', { name: 'Nope' }],
			['PUT', '/contacts', { soundingId: 'x', unitId: 'y', topElevation: 0 }],
			['PATCH', '/site', { groundwaterElevation: 1 }],
			['POST', '/zonations', { name: 'Nope' }],
			['POST', '/zone-boundaries', { unitId: 'x', chainageTop: 0, elevationTop: 1, chainageBottom: 0, elevationBottom: 0 }]
		] as const) {
			const res = await viewer.json(method, api(demoId, path), body);
			expect(res.status, `${method} ${path}`).toBe(403);
			expect((await errorOf(res)).code).toBe('forbidden');
		}
	});

	it('anonymous requests get 401 and a project the user is not in is a 404', async () => {
		expect((await new HttpSession(baseUrl).json('GET', api(demoId, '/zonations'))).status).toBe(401);
		const res = await viewer.json('GET', api(ownId, '/units'));
		expect(res.status).toBe(404);
		expect((await viewer.json('GET', api(ownId, '/domains/whatever/samples'))).status).toBe(404);
	});

	it('bad bodies answer 422 with the issues, bad JSON 400, a duplicate name 409, unknown ids 404', async () => {
		const colour = await analyst.json('POST', api(ownId, '/units'), { name: 'Silt', colour: 'brown', property: 'suRatio' });
		expect(colour.status).toBe(422);
		expect((await errorOf(colour)).issues?.[0]).toMatchObject({ path: ['colour'] });
		// A new unit names its property: no silent qc1Ncs for a clay.
		const noProperty = await analyst.json('POST', api(ownId, '/units'), { name: 'Soft clay' });
		expect(noProperty.status).toBe(422);
		expect((await errorOf(noProperty)).issues?.[0]).toMatchObject({ path: ['property'], message: expect.stringMatching(/Choose the property to simulate the unit in/) });
		const top = await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[0], unitId: 'u', topElevation: 'high' });
		expect(top.status).toBe(422);
		const above = await analyst.json('POST', api(ownId, '/zone-boundaries'), { unitId: 'u', chainageTop: 0, elevationTop: -5, chainageBottom: 0, elevationBottom: 0 });
		expect(above.status).toBe(422);
		expect((await errorOf(above)).issues?.[0].message).toMatch(/higher than its bottom/);
		const line = await analyst.json('PATCH', api(ownId, '/site'), { sectionLine: [[1, 1]] });
		expect(line.status).toBe(422);
		const same = await analyst.json('PATCH', api(ownId, '/site'), { sectionLine: [[1, 1], [1, 1]] });
		expect(same.status).toBe(422);
		const json = await analyst.fetch(api(ownId, '/units'), { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"name":' });
		expect(json.status).toBe(400);
		expect((await analyst.json('POST', api(ownId, '/units'), { name: 'clay', property: 'suRatio' })).status).toBe(409);
		expect((await analyst.json('GET', api(ownId, '/section?property=colour'))).status).toBe(422);
		expect((await analyst.json('PATCH', api(ownId, '/units/no-such-unit'), { nkt: 12 })).status).toBe(404);
		const ground = await analyst.json('PUT', api(ownId, '/contacts'), { soundingId: soundingIds[0], unitId: (await ok<{ units: UnitJson[] }>(await analyst.json('GET', api(ownId, '/units')))).units[0].id, topElevation: 99 });
		expect(ground.status).toBe(422);
		expect((await errorOf(ground)).message).toMatch(/above the ground surface/);
	});
});
