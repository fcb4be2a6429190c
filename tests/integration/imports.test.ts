/**
 * Uploads over HTTP against the built server: the plan of an upload (dryRun), clashing sounding names
 * resolved per clash (skip, replace, keep both) with nothing written on a refusal, GEF files with real-world
 * habits (notes in the response, a borehole log refused), contacts from an AGS4 GEOL group, and the readings
 * CSV checked against the derived properties of the JSON API.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, signedInSession, type HttpSession } from '../setup';

const baseUrl = inject('baseUrl');
const FIXTURES = join(import.meta.dirname, '..', 'cpt', 'fixtures');

interface FileSpec {
	name: string;
	bytes: Uint8Array;
}
const fixture = (path: string): FileSpec => ({ name: path.split('/').pop()!, bytes: new Uint8Array(readFileSync(join(FIXTURES, path))) });
const textFile = (name: string, text: string): FileSpec => ({ name, bytes: new TextEncoder().encode(text) });
const gef = (id: string, qc = 1.5) =>
	textFile(
		`${id}-${qc}.gef`,
		`#GEFID= 1, 1, 0\n#TESTID= ${id}\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n` +
			`#COLUMNINFO= 3, MPa, local friction, 3\n#ZID= 0, 2.5, 0\n#EOH=\n0.10 1.0 0.015\n0.20 1.2 0.02\n0.30 ${qc} 0.021\n`
	);

function upload(s: HttpSession, projectId: string, files: FileSpec[], options?: unknown): Promise<Response> {
	const body = new FormData();
	for (const f of files) body.append('files', new Blob([f.bytes as BlobPart]), f.name);
	if (options !== undefined) body.append('options', JSON.stringify(options));
	return s.fetch(`/api/v1/projects/${projectId}/soundings`, { method: 'POST', body });
}

interface Listed {
	id: string;
	name: string;
	readings: number;
	maxQc: number;
	sourceFile: { name: string } | null;
}
async function list(s: HttpSession, projectId: string): Promise<Listed[]> {
	const res = await s.json('GET', `/api/v1/projects/${projectId}/soundings`);
	expect(res.status).toBe(200);
	return ((await res.json()) as { soundings: Listed[] }).soundings;
}
const names = async (s: HttpSession, id: string) => (await list(s, id)).map((x) => `${x.name}:${x.maxQc}`);

let analyst: HttpSession;
let viewer: HttpSession;
let owner: HttpSession;
let demoId: string;

async function newProject(name: string): Promise<string> {
	const res = await analyst.json('POST', '/api/v1/projects', { name, description: '', lengthUnit: 'm' });
	expect(res.status).toBe(201);
	return ((await res.json()) as { project: { id: string } }).project.id;
}

beforeAll(async () => {
	analyst = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	viewer = await signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password);
	owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
	const res = await analyst.json('GET', '/api/v1/projects');
	demoId = ((await res.json()) as { projects: { id: string; name: string }[] }).projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
});

describe('POST /soundings with clashing names', () => {
	let id: string;
	beforeAll(async () => {
		id = await newProject('Clashes');
		expect((await upload(analyst, id, [gef('CPT-07'), gef('CPT-08')])).status).toBe(201);
	});

	it('dryRun answers 200 with the plan (each clash, what it clashes with, a suggested name) and writes nothing', async () => {
		const before = await names(analyst, id);
		const res = await upload(analyst, id, [gef('CPT-07', 1.6), gef('CPT-09'), gef('CPT-09', 1.7)], { dryRun: true });
		expect(res.status).toBe(200);
		const { plan } = (await res.json()) as { plan: { unresolved: number; soundings: { file: string; name: string; action: string; clash: { with: string; suggestedName: string; existing?: { name: string } } | null }[] } };
		expect(plan.unresolved).toBe(2);
		expect(plan.soundings.map((s) => [s.name, s.action, s.clash?.with ?? null, s.clash?.suggestedName ?? null])).toEqual([
			['CPT-07', 'unresolved', 'project', 'CPT-07 (2)'],
			['CPT-09', 'import', null, null],
			['CPT-09', 'unresolved', 'upload', 'CPT-09 (2)']
		]);
		expect(await names(analyst, id)).toEqual(before);
	});

	it('without a choice the upload is refused with 409, the clash named, the plan in the error, and nothing written', async () => {
		const before = await names(analyst, id);
		const res = await upload(analyst, id, [gef('CPT-07', 1.6), gef('CPT-10')]);
		expect(res.status).toBe(409);
		const { error } = (await res.json()) as { error: { code: string; files: { file: string; code: string; message: string }[]; plan: { unresolved: number } } };
		expect(error.code).toBe('conflict');
		expect(error.files).toEqual([{ file: 'CPT-07-1.6.gef', code: 'sounding-exists', message: expect.stringContaining('sounding CPT-07 is already in the project') }]);
		expect(error.plan.unresolved).toBe(1);
		expect(await names(analyst, id)).toEqual(before);
	});

	it('"skip" imports the rest and leaves the project\'s sounding as it was', async () => {
		const res = await upload(analyst, id, [gef('CPT-07', 1.6), gef('CPT-11')], { clashes: [{ file: 'CPT-07-1.6.gef', sounding: 'CPT-07', action: 'skip' }] });
		expect(res.status).toBe(201);
		const body = (await res.json()) as { files: { name: string; soundings: { name: string }[]; skipped: string[] }[] };
		expect(body.files.map((f) => f.name)).toEqual(['CPT-11-1.5.gef']);
		expect(await names(analyst, id)).toEqual(['CPT-07:1500', 'CPT-08:1500', 'CPT-11:1500']);
	});

	it('"replace" stores the new readings under the same sounding id', async () => {
		const [before] = await list(analyst, id);
		const res = await upload(analyst, id, [gef('CPT-07', 3.2)], { clashes: [{ file: 'CPT-07-3.2.gef', sounding: 'CPT-07', action: 'replace' }] });
		expect(res.status).toBe(201);
		const body = (await res.json()) as { files: { soundings: { id: string; name: string; action: string }[] }[] };
		expect(body.files[0].soundings[0]).toMatchObject({ id: before.id, name: 'CPT-07', action: 'replace' });
		const [after] = await list(analyst, id);
		expect(after).toMatchObject({ id: before.id, maxQc: 3200, sourceFile: { name: 'CPT-07-3.2.gef' } });
	});

	it('"rename" keeps both under the suggested name, and a name that is taken is refused with nothing written', async () => {
		const taken = await upload(analyst, id, [gef('CPT-08', 2.9), gef('CPT-12')], { clashes: [{ file: 'CPT-08-2.9.gef', sounding: 'CPT-08', action: 'rename', name: 'CPT-11' }] });
		expect(taken.status).toBe(409);
		expect(((await taken.json()) as { error: { files: { message: string }[] } }).error.files[0].message).toContain('the new name CPT-11 is taken too');
		expect(await names(analyst, id)).toEqual(['CPT-07:3200', 'CPT-08:1500', 'CPT-11:1500']);
		const res = await upload(analyst, id, [gef('CPT-08', 2.9), gef('CPT-12')], { clashes: [{ file: 'CPT-08-2.9.gef', sounding: 'CPT-08', action: 'rename' }] });
		expect(res.status).toBe(201);
		const body = (await res.json()) as { files: { soundings: { name: string; action: string; originalName?: string }[] }[] };
		expect(body.files[0].soundings[0]).toEqual(expect.objectContaining({ name: 'CPT-08 (2)', action: 'rename', originalName: 'CPT-08' }));
		expect(await names(analyst, id)).toEqual(['CPT-07:3200', 'CPT-08:1500', 'CPT-08 (2):2900', 'CPT-11:1500', 'CPT-12:1500']);
	});

	it('two concurrent uploads of one new name: one is imported, the other refused with 409, and the name is stored once', async () => {
		const [a, b] = await Promise.all([upload(analyst, id, [gef('RACE-1', 1.6)]), upload(analyst, id, [gef('RACE-1', 1.8)])]);
		expect([a.status, b.status].sort()).toEqual([201, 409]);
		expect((await list(analyst, id)).filter((s) => s.name === 'RACE-1')).toHaveLength(1);
	});

	it('refuses invalid choices (422), a viewer\'s dry run (403), and a dry run in a project that is not yours (404)', async () => {
		const bad = await upload(analyst, id, [gef('CPT-07', 1.6)], { clashes: [{ file: 'x', sounding: 'CPT-07', action: 'merge' }] });
		expect(bad.status).toBe(422);
		const longName = await upload(analyst, id, [gef('CPT-07', 1.6)], { clashes: [{ file: 'x', sounding: 'CPT-07', action: 'rename', name: 'x'.repeat(101) }] });
		expect(longName.status).toBe(422);
		expect((await upload(viewer, id, [gef('CPT-07', 1.6)], { dryRun: true })).status).toBe(404);
		expect((await upload(viewer, demoId, [gef('CPT-07', 1.6)], { dryRun: true })).status).toBe(403);
	});
});

describe('POST /soundings with real-world GEF files and an AGS4 GEOL group', () => {
	it('imports negative penetration lengths and void corrected depth with notes in the response', async () => {
		const id = await newProject('Real GEF');
		const res = await upload(analyst, id, [fixture('gef/negative-penetration.gef'), fixture('gef/void-corrected-depth.gef')]);
		expect(res.status).toBe(201);
		const body = (await res.json()) as { files: { soundings: { name: string; notes: string[] }[] }[] };
		expect(body.files.map((f) => f.soundings[0])).toEqual([
			expect.objectContaining({ name: 'PS-114', notes: ['Penetration length is recorded as negative numbers growing downward; read as depth below ground'] }),
			expect.objectContaining({ name: 'DP-07', notes: ['corrected depth (quantity 11) is void in the first 6 readings (to 0.12 m); penetration length is used there'] })
		]);
	});

	it('refuses a borehole log with 422 "this is a borehole log, not a CPT" and writes nothing', async () => {
		const id = await newProject('Borehole');
		const res = await upload(analyst, id, [fixture('gef/borehole-log.gef'), fixture('gef/unit-spellings.gef')]);
		expect(res.status).toBe(422);
		const { error } = (await res.json()) as { error: { files: { file: string; code: string; line: number; message: string }[] } };
		expect(error.files).toEqual([expect.objectContaining({ file: 'borehole-log.gef', code: 'not-a-cpt', line: 5 })]);
		expect(error.files[0].message).toContain('this is a borehole log, not a CPT');
		expect(await list(analyst, id)).toEqual([]);
	});

	it('offers the GEOL group in the plan, then writes its contacts for the imported soundings', async () => {
		const id = await newProject('GEOL');
		const ags = fixture('ags4/geol.ags');
		const dry = await upload(analyst, id, [ags], { dryRun: true });
		const { plan } = (await dry.json()) as { plan: { geology: { keys: { key: string; suggestedUnit: string }[] } } };
		expect(plan.geology.keys.map((k) => k.key)).toEqual(['MG', 'ALV', 'SND']);
		const geology = { units: plan.geology.keys.map((k) => ({ key: k.key, unit: { MG: 'Made ground', ALV: 'Soft clay', SND: 'Sand' }[k.key] })) };
		const res = await upload(analyst, id, [ags], { geology });
		expect(res.status).toBe(201);
		expect(((await res.json()) as { geology: unknown }).geology).toEqual({ contacts: 9, unitsCreated: ['Made ground', 'Soft clay', 'Sand'] });
		const units = ((await (await analyst.json('GET', `/api/v1/projects/${id}/units`)).json()) as { units: { id: string; name: string }[] }).units;
		const contacts = ((await (await analyst.json('GET', `/api/v1/projects/${id}/contacts`)).json()) as { contacts: { soundingName: string; unitId: string; topElevation: number }[] }).contacts;
		const sand = units.find((u) => u.name === 'Sand')!;
		// LOCA_GL 2.40 − GEOL_TOP 4.50 at CF-01.
		expect(contacts.find((c) => c.soundingName === 'CF-01' && c.unitId === sand.id)!.topElevation).toBeCloseTo(2.4 - 4.5, 12);
		expect(contacts).toHaveLength(9);
	});
});

describe('GET /soundings/readings.csv and /soundings/[sid]/readings.csv', () => {
	interface Detail {
		sounding: { name: string };
		columns: { depth: (number | null)[]; qc: (number | null)[] };
		derived: Record<string, (number | null)[]>;
	}
	const DECIMALS: Record<string, [string, number]> = {
		'depth (m)': ['depth', 3],
		'qt (kPa)': ['qt', 0],
		'σ′v (kPa)': ['sigmaVeff', 1],
		Ic: ['Ic', 2],
		qc1Ncs: ['qc1Ncs', 1],
		'su/σ′v': ['suRatio', 3],
		'FC (%)': ['FC', 1],
		CRR: ['CRR', 3]
	};

	it('one sounding\'s CSV parses (RFC 4180) into its readings, rounded per property within half a unit of the last decimal', async () => {
		const [lv07] = (await list(viewer, demoId)).filter((s) => s.name === 'LV-07');
		const res = await viewer.fetch(`/api/v1/projects/${demoId}/soundings/${lv07.id}/readings.csv`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="Riverside-levee-demo-LV-07-readings.csv"');
		const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
		const detail = (await (await viewer.json('GET', `/api/v1/projects/${demoId}/soundings/${lv07.id}`)).json()) as Detail;
		expect(rows).toHaveLength(lv07.readings);
		expect(Object.keys(rows[0])).toEqual(expect.arrayContaining(['sounding', 'unit', 'qc (kPa)', 'flags', ...Object.keys(DECIMALS)]));
		let compared = 0;
		for (const [header, [key, decimals]] of Object.entries(DECIMALS)) {
			const source = key === 'depth' ? detail.columns.depth : detail.derived[key];
			rows.forEach((row, i) => {
				const want = source[i];
				if (want === null) return expect(row[header], `${header} row ${i}`).toBe('');
				const cell = row[header];
				expect(cell.split('.')[1]?.length ?? 0, `${header} decimals`).toBe(decimals);
				expect(Math.abs(Number(cell) - want), `${header} row ${i}`).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-9);
				compared++;
			});
		}
		expect(compared).toBeGreaterThan(lv07.readings * 6);
		expect(rows.every((r) => r.sounding === 'LV-07')).toBe(true);
		expect(new Set(rows.map((r) => r.unit)).size).toBeGreaterThan(1);
	});

	it('the project CSV holds every reading of every sounding (or of the chosen ones), in name order', async () => {
		const soundings = await list(viewer, demoId);
		const all = parse(await (await viewer.fetch(`/api/v1/projects/${demoId}/soundings/readings.csv`)).text(), { columns: true }) as Record<string, string>[];
		expect(all).toHaveLength(soundings.reduce((n, s) => n + s.readings, 0));
		expect([...new Set(all.map((r) => r.sounding))]).toEqual(soundings.map((s) => s.name));
		const two = soundings.slice(3, 5);
		const some = parse(await (await viewer.fetch(`/api/v1/projects/${demoId}/soundings/readings.csv?s=${two.map((s) => s.id).join(',')}`)).text(), { columns: true }) as Record<string, string>[];
		expect([...new Set(some.map((r) => r.sounding))]).toEqual(two.map((s) => s.name));
	});

	it('answers 404 for a sounding or project that is not yours, and 401 without a session', async () => {
		const id = await newProject('Private readings');
		await upload(analyst, id, [gef('P-1')]);
		const [p1] = await list(analyst, id);
		expect((await owner.fetch(`/api/v1/projects/${id}/soundings/readings.csv`)).status).toBe(404);
		expect((await analyst.fetch(`/api/v1/projects/${demoId}/soundings/${p1.id}/readings.csv`)).status).toBe(404);
		expect((await fetch(new URL(`/api/v1/projects/${demoId}/soundings/readings.csv`, baseUrl))).status).toBe(401);
	});
});
