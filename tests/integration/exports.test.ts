/**
 * The exports over HTTP on loopback against the built server (a contract: paths and shapes as issue 14 gives them):
 * CSV values equal regenerate() here bit for bit when parsed by a general-purpose parser (csv-parse); two concurrent
 * downloads byte-identical; a ZIP's entries and manifest (read by Python's zipfile); VTK files read back by an
 * independent reader (Debian's python3-meshio) with arrays equal to the CSV's; transfer columns at worked values;
 * variable cell heights and uploaded meshes as targets; mesh refusals with line and column; export jobs with
 * progress, download, mail, cancel; and every refusal (no session, bad token, another project, role, origin,
 * malformed queries, concurrent duplicates).
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';
import { crrBI2014, lookUp, relativeDensityIB2008 } from '../../src/lib/cpt/index';
import { recipeSchema, regenerate, type Recipe } from '../../src/lib/geostat/index';
import { expectSameBits } from '../asserts';

const baseUrl = inject('baseUrl');
const dir = mkdtempSync(join(tmpdir(), 'conefield-exports-'));
const reader = resolve(import.meta.dirname, '..', 'setup', 'read-files.py');

let analyst: HttpSession;
let viewer: HttpSession;
let reviewer: HttpSession;
let admin: HttpSession;
let demoId: string;
let base: string;
let zonation: { id: string; name: string; domains: { id: string; name: string; property: string }[] };
let recipeId: string;
let recipe: Recipe;
let hash: string;

// A coarse grid over the demo section: a few hundred cells a realization, 4 realizations.
const setup = (over: Record<string, unknown> = {}) => ({
	name: 'Exports coarse',
	zonationId: zonation.id,
	seed: 'exports-1',
	realizations: 4,
	grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 10 }, elevation: { from: -12, to: 5, cell: 1 } },
	domains: zonation.domains.map((d) => ({ domainId: d.id, simulate: true })),
	...over
});

/** Float64 from base64 of little-endian doubles (the Python reader's arrays). */
function doubles(b64: string): Float64Array {
	const bytes = Buffer.from(b64, 'base64');
	return new Float64Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
}

function python(kind: 'vtk' | 'zip', bytes: Uint8Array) {
	if (!existsSync('/usr/bin/python3')) throw new Error('the export tests need /usr/bin/python3 with python3-meshio (.ci/run installs it)');
	const file = join(dir, `${crypto.randomUUID()}.${kind}`);
	writeFileSync(file, bytes);
	return JSON.parse(execFileSync('/usr/bin/python3', [reader, kind, file], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 }));
}

/** A CSV as records (csv-parse, RFC 4180) with numbers read by Number (shortest round-trip text parses exactly). */
function csvRecords(text: string): Record<string, string>[] {
	return parse(text, { columns: true, skip_empty_lines: true }) as Record<string, string>[];
}

const num = (s: string | undefined) => (s === undefined || s === '' ? NaN : Number(s));

async function errorOf(res: Response) {
	return ((await res.json()) as { error: { code: string; message: string; issues?: { path: unknown[]; message: string }[]; files?: { line?: number; column?: string; message: string }[] } }).error;
}

async function bytesOf(res: Response): Promise<Uint8Array> {
	return new Uint8Array(await res.arrayBuffer());
}

async function createRecipe(body: unknown): Promise<{ id: string; hash: string; provenance: Record<string, unknown> }> {
	const res = await analyst.json('POST', base + '/recipes', body);
	if (res.status !== 201 && res.status !== 200) throw new Error(`create failed: ${res.status} ${await res.text()}`);
	return (await res.json()).recipe;
}

async function documentOf(id: string): Promise<Recipe> {
	return recipeSchema.parse(JSON.parse(await (await viewer.fetch(`${base}/recipes/${id}/recipe.json`)).text()));
}

/** The simulated value of each CSV row (its domain's property column), NaN where not simulated. */
function simulatedColumn(records: Record<string, string>[], properties: string[]): Float64Array {
	return Float64Array.from(records, (r) => {
		for (const p of properties) if (r[p] !== undefined && r[p] !== '') return Number(r[p]);
		return NaN;
	});
}

beforeAll(async () => {
	[analyst, viewer, reviewer, admin] = await Promise.all([
		signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password),
		signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password),
		signedInSession(baseUrl, DEMO.reviewer.email, DEMO.reviewer.password),
		signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password)
	]);
	const { projects } = (await (await analyst.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	base = `/api/v1/projects/${demoId}`;
	const { zonations } = await (await viewer.json('GET', `${base}/zonations`)).json();
	zonation = zonations.find((z: { name: string }) => z.name === 'Sand split at channel');
	const made = await createRecipe(setup());
	recipeId = made.id;
	hash = made.hash;
	recipe = await documentOf(recipeId);
}, 120_000);

describe('GET …/recipes/:rid/realizations/:r.csv', () => {
	it('streams realization r: parsed by csv-parse, its values equal regenerate() here bit for bit; the file is named after project, recipe and realization', async () => {
		const res = await viewer.fetch(`${base}/recipes/${recipeId}/realizations/2.csv`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="Riverside-levee-demo_Exports-coarse_r2.csv"');
		expect(res.headers.get('x-recipe-hash')).toBe(hash);
		const records = csvRecords(await res.text());
		expect(Object.keys(records[0])).toEqual(['cell', 'i', 'k', 'chainage (m)', 'elevation (m)', 'domain', 'suRatio', 'qc1Ncs']);
		const expected = regenerate(recipe, 2);
		expect(records.length).toBe(expected.length);
		expectSameBits(simulatedColumn(records, ['suRatio', 'qc1Ncs']), expected);
		expect(records.map((r) => Number(r.cell))).toEqual(Array.from({ length: expected.length }, (_, i) => i));
		// Not simulated: blank domain and values.
		const blank = records.findIndex((r) => r.domain === '');
		expect(Number.isNaN(expected[blank])).toBe(true);
	});

	it('?digits=4 writes 4 significant digits', async () => {
		const records = csvRecords(await (await viewer.fetch(`${base}/recipes/${recipeId}/realizations/0.csv?digits=4`)).text());
		const expected = regenerate(recipe, 0);
		const got = simulatedColumn(records, ['suRatio', 'qc1Ncs']);
		for (let i = 0; i < expected.length; i++) {
			if (Number.isNaN(expected[i])) expect(Number.isNaN(got[i])).toBe(true);
			else expect(got[i]).toBe(Number(expected[i].toPrecision(4)));
		}
	});

	it('refuses a realization beyond N (404), a malformed number (404), bad digits (422), an unknown transfer set (404)', async () => {
		expect((await viewer.fetch(`${base}/recipes/${recipeId}/realizations/4.csv`)).status).toBe(404);
		expect((await viewer.fetch(`${base}/recipes/${recipeId}/realizations/x.csv`)).status).toBe(404);
		const bad = await viewer.fetch(`${base}/recipes/${recipeId}/realizations/0.csv?digits=0`);
		expect(bad.status).toBe(422);
		expect((await errorOf(bad)).issues?.[0].path).toEqual(['digits']);
		expect((await viewer.fetch(`${base}/recipes/${recipeId}/realizations/0.csv?transfer=nope`)).status).toBe(404);
	});

	it('refuses without a session (401), with a bad token (401), a non-member (404), and reads with an API token', async () => {
		const path = `${base}/recipes/${recipeId}/realizations/0.csv`;
		expect((await new HttpSession(baseUrl).fetch(path)).status).toBe(401);
		expect((await new HttpSession(baseUrl).fetch(path, { headers: { authorization: 'Bearer cf_not-a-token' } })).status).toBe(401);
		expect((await admin.fetch(path)).status).toBe(404);
		const { token } = await (await viewer.json('POST', '/api/v1/account/tokens', { name: 'exports test', expiresInDays: 7 })).json();
		const res = await new HttpSession(baseUrl).fetch(path, { headers: { authorization: `Bearer ${token}` } });
		expect(res.status).toBe(200);
		expect((await res.text()).split('\r\n').length).toBe(recipe.targets.kind === 'grid' ? recipe.targets.domainRuns.reduce((a, r) => a + r[1], 0) + 2 : 0);
	});

	it('answers 404 for a recipe of another project', async () => {
		const other = (await (await analyst.json('POST', '/api/v1/projects', { name: 'Exports elsewhere' })).json()).project.id;
		expect((await analyst.fetch(`/api/v1/projects/${other}/recipes/${recipeId}/realizations/0.csv`)).status).toBe(404);
	});
});

describe('GET …/recipes/:rid/export.zip', () => {
	const query = '?realizations=0-2&format=csv&maps=mean,p50';

	it('two concurrent downloads are byte-identical; the zip lists the entries and its manifest names the recipe hash', async () => {
		const [a, b] = await Promise.all([viewer.fetch(`${base}/recipes/${recipeId}/export.zip${query}`), reviewer.fetch(`${base}/recipes/${recipeId}/export.zip${query}`)]);
		expect([a.status, b.status]).toEqual([200, 200]);
		expect(a.headers.get('content-disposition')).toBe('attachment; filename="Riverside-levee-demo_Exports-coarse_r0-2_csv.zip"');
		const [x, y] = [await bytesOf(a), await bytesOf(b)];
		expect(createHash('sha256').update(x).digest('hex')).toBe(createHash('sha256').update(y).digest('hex'));
		const zip = python('zip', x);
		expect(zip.ok).toBe(true);
		expect(zip.names).toEqual([
			'recipe.json',
			'Riverside-levee-demo_Exports-coarse_r000.csv',
			'Riverside-levee-demo_Exports-coarse_r001.csv',
			'Riverside-levee-demo_Exports-coarse_r002.csv',
			'Riverside-levee-demo_Exports-coarse_maps.csv',
			'manifest.json'
		]);
		expect(createHash('sha256').update(zip.texts['recipe.json']).digest('hex')).toBe(hash);
		const manifest = JSON.parse(zip.texts['manifest.json']);
		expect(manifest.recipe).toMatchObject({ id: recipeId, hash, engineVersion: recipe.engineVersion, realizations: 4 });
		expect(manifest.realizations).toEqual([0, 1, 2]);
		expect(manifest.units.length).toBe('m');
		expect(manifest.columns.map((c: { name: string }) => c.name)).toEqual(['cell', 'i', 'k', 'chainage (m)', 'elevation (m)', 'domain', 'suRatio', 'qc1Ncs']);
		expect(manifest.caution).toMatch(/do not replace, the judgement of a licensed engineer/);
		expect(manifest.transfer).toBeNull();
		// Each realization's CSV holds regenerate()'s bits.
		expectSameBits(simulatedColumn(csvRecords(zip.texts['Riverside-levee-demo_Exports-coarse_r001.csv']), ['suRatio', 'qc1Ncs']), regenerate(recipe, 1));
		// The maps are the summary endpoint's (mean over all 4 realizations).
		const mean = (await (await viewer.json('GET', `${base}/recipes/${recipeId}/summary?stat=mean`)).json()).values as (number | null)[];
		const maps = csvRecords(zip.texts['Riverside-levee-demo_Exports-coarse_maps.csv']);
		expectSameBits(Float64Array.from(maps, (r) => num(r.mean)), Float64Array.from(mean, (v) => (v === null ? NaN : v)));
	});

	it('refuses realizations out of range (404), a malformed list or format (422), and P(below) without a threshold (422)', async () => {
		expect((await viewer.fetch(`${base}/recipes/${recipeId}/export.zip?realizations=0-9`)).status).toBe(404);
		for (const q of ['realizations=abc', 'realizations=3-1', 'realizations=0-1&format=xls', 'realizations=0&maps=below', 'realizations=0&maps=mode']) {
			expect((await viewer.fetch(`${base}/recipes/${recipeId}/export.zip?${q}`)).status, q).toBe(422);
		}
	});
});

describe('VTK files read back by python3-meshio', () => {
	it('a grid realization is a rectilinear grid whose cell arrays equal the CSV’s', async () => {
		const [vtkRes, csvRes] = await Promise.all([viewer.fetch(`${base}/recipes/${recipeId}/realizations/3.vtk`), viewer.fetch(`${base}/recipes/${recipeId}/realizations/3.csv`)]);
		expect(vtkRes.headers.get('content-disposition')).toBe('attachment; filename="Riverside-levee-demo_Exports-coarse_r3.vtk"');
		const m = python('vtk', await bytesOf(vtkRes));
		const records = csvRecords(await csvRes.text());
		expect(m.cells).toEqual([['quad', records.length]]);
		for (const p of ['qc1Ncs', 'suRatio']) expectSameBits(doubles(m.cell_data[p]), Float64Array.from(records, (r) => num(r[p])), p);
		expect(Array.from(doubles(m.cell_data.domain)).slice(0, 3)).toEqual([4, 4, 4]);
	});

	it('ensemble maps as VTK equal the maps CSV', async () => {
		const [v, c] = await Promise.all([viewer.fetch(`${base}/recipes/${recipeId}/maps.vtk?stats=mean,sd`), viewer.fetch(`${base}/recipes/${recipeId}/maps.csv?stats=mean,sd`)]);
		const m = python('vtk', await bytesOf(v));
		const records = csvRecords(await c.text());
		for (const s of ['mean', 'sd']) expectSameBits(doubles(m.cell_data[s]), Float64Array.from(records, (r) => num(r[s])), s);
	});
});

describe('transfer tables and sets', () => {
	let setId: string;
	const table = { name: 'Modulus coefficient', input: 'qc1Ncs', output: 'Kcoef', outputUnit: '–', monotonic: 'increasing', points: [[60, 500], [120, 800], [200, 1500]] };

	it('an analyst saves a table (version 1, then 2 under the same name); concurrent saves get distinct versions', async () => {
		const [a, b] = await Promise.all([analyst.json('POST', `${base}/transfer-tables`, table), analyst.json('POST', `${base}/transfer-tables`, { ...table, points: [[60, 400], [200, 1400]] })]);
		expect([a.status, b.status]).toEqual([201, 201]);
		const versions = [(await a.json()).table.version, (await b.json()).table.version].sort();
		expect(versions).toEqual([1, 2]);
	});

	it('refuses a table whose outputs fall where they must rise, inputs out of order (422), and a viewer (403)', async () => {
		const bad = await analyst.json('POST', `${base}/transfer-tables`, { ...table, points: [[60, 500], [120, 400]] });
		expect(bad.status).toBe(422);
		expect((await errorOf(bad)).issues?.[0].message).toMatch(/must not fall/);
		expect((await analyst.json('POST', `${base}/transfer-tables`, { ...table, points: [[60, 500], [50, 600]] })).status).toBe(422);
		expect((await viewer.json('POST', `${base}/transfer-tables`, table)).status).toBe(403);
	});

	it('a set whose outputs do not read the rule’s property is refused with each output named (422)', async () => {
		const res = await analyst.json('POST', `${base}/transfer-sets`, { name: 'Wrong', rules: [{ property: 'suRatio', outputs: [{ relation: 'dr-ib2008' }] }] });
		expect(res.status).toBe(422);
		expect((await errorOf(res)).issues?.[0].path).toEqual(['rules', 0, 'outputs', 0]);
	});

	it('CSV columns of a transfer set: Dr and CRR at the cited equations, the table held at its ends and counted, su = su/σ′v × σ′v', async () => {
		const tables = (await (await viewer.json('GET', `${base}/transfer-tables`)).json()).tables as { id: string; name: string; version: number; points: [number, number][]; monotonic: 'increasing' }[];
		const t1 = tables.find((t) => t.name === table.name && t.version === 1)!;
		const made = await analyst.json('POST', `${base}/transfer-sets`, {
			name: 'Model inputs',
			rules: [
				{ property: 'qc1Ncs', outputs: [{ relation: 'dr-ib2008' }, { relation: 'crr-bi2014' }, { tableId: t1.id }] },
				{ property: 'suRatio', outputs: [{ relation: 'su-from-ratio' }] }
			]
		});
		expect(made.status).toBe(201);
		setId = (await made.json()).set.id;
		const records = csvRecords(await (await viewer.fetch(`${base}/recipes/${recipeId}/realizations/1.csv?transfer=${setId}`)).text());
		expect(Object.keys(records[0]).slice(8)).toEqual(['su (kPa)', 'Dr', 'CRR_M7.5_1atm', 'Kcoef']);
		let checked = 0;
		for (const r of records) {
			const q = num(r.qc1Ncs);
			if (!Number.isNaN(q)) {
				// Idriss & Boulanger (2008) and Boulanger & Idriss (2014), inputs held within their ranges (21–254, ≤ 211).
				expect(num(r.Dr)).toBe(relativeDensityIB2008(Math.min(254, Math.max(21, q))));
				expect(num(r['CRR_M7.5_1atm'])).toBe(crrBI2014(Math.min(211, q)));
				expect(num(r.Kcoef)).toBe(lookUp(t1, q).value);
				expect(r['su (kPa)']).toBe('');
				checked++;
			}
			const s = num(r.suRatio);
			if (!Number.isNaN(s)) {
				expect(num(r['su (kPa)'])).toBeGreaterThan(0);
				expect(r.Dr).toBe('');
			}
		}
		expect(checked).toBeGreaterThan(100);
		// σ′v does not depend on the realization: su/(su/σ′v) is the same at a cell in two realizations.
		const other = csvRecords(await (await viewer.fetch(`${base}/recipes/${recipeId}/realizations/2.csv?transfer=${setId}`)).text());
		const k = records.findIndex((r) => r.suRatio !== '');
		expect(num(records[k]['su (kPa)']) / num(records[k].suRatio)).toBeCloseTo(num(other[k]['su (kPa)']) / num(other[k].suRatio), 9);
	});

	it('the ZIP manifest records the set and its tables, and counts the values held at the table’s ends', async () => {
		const zip = python('zip', await bytesOf(await viewer.fetch(`${base}/recipes/${recipeId}/export.zip?realizations=0&transfer=${setId}`)));
		const manifest = JSON.parse(zip.texts['manifest.json']);
		expect(manifest.transfer.set).toMatchObject({ id: setId, name: 'Model inputs', version: 1 });
		expect(manifest.transfer.tables.map((t: { name: string; version: number }) => [t.name, t.version])).toEqual([['Modulus coefficient', 1]]);
		const records = csvRecords(zip.texts['Riverside-levee-demo_Exports-coarse_r000.csv']);
		const below = records.filter((r) => r.qc1Ncs !== '' && num(r.qc1Ncs) < 60).length;
		const above = records.filter((r) => r.qc1Ncs !== '' && num(r.qc1Ncs) > 200).length;
		expect(manifest.notes.join(' ')).toContain(`Kcoef: ${below.toLocaleString('en')} value(s) fell below and ${above.toLocaleString('en')} above table Modulus coefficient version 1`);
	});
});

describe('variable cell heights', () => {
	it('a grid with 0.25 m cells above −4 m and 1 m below: rectilinear targets, the VTK’s z coordinates are the cell edges', async () => {
		const made = await createRecipe(
			setup({ name: 'Exports graded', grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1, heights: { bands: [{ from: -4, to: 5, cell: 0.25 }] } } } })
		);
		const grid = made.provenance.grid as { counts: { x: number; z: number }; zEdges: number[] };
		expect(grid.counts).toEqual({ x: 20, y: 1, z: 8 + 36 });
		expect(grid.zEdges.slice(6, 11)).toEqual([-6, -5, -4, -3.75, -3.5]);
		const doc = await documentOf(made.id);
		expect(doc.targets.kind).toBe('rectilinear');
		const records = csvRecords(await (await viewer.fetch(`${base}/recipes/${made.id}/realizations/0.csv`)).text());
		expectSameBits(simulatedColumn(records, ['suRatio', 'qc1Ncs']), regenerate(doc, 0));
		expect(num(records[20 * 8]['elevation (m)'])).toBe(-3.875);
		const m = python('vtk', await bytesOf(await viewer.fetch(`${base}/recipes/${made.id}/realizations/0.vtk`)));
		const z = Array.from(doubles(m.points)).filter((_, i) => i % 3 === 2);
		expect([...new Set(z)].sort((a, b) => a - b)).toEqual(grid.zEdges);
		expectSameBits(doubles(m.cell_data.qc1Ncs), Float64Array.from(records, (r) => num(r.qc1Ncs)));
	});
});

describe('uploaded meshes', () => {
	/** A structured 2D mesh over the demo section: columns 8 m wide, 0.25 m tall above −4 m and 1 m below. */
	function meshCsv(): string {
		const rows = ['element,x,y,material'];
		let n = 0;
		for (let c = 0; c < 50; c++) {
			for (let z = 4.9; z > -12; ) {
				const h = z > -4 ? 0.25 : 1;
				rows.push(`E${++n},${4 + 8 * c},${(z - h / 2).toFixed(4)},${z > -4 ? 'upper' : 'lower'}`);
				z -= h;
			}
		}
		return rows.join('\n') + '\n';
	}
	const upload = (session: HttpSession, text: string, options: unknown, name = 'mesh.csv') => {
		const body = new FormData();
		body.append('file', new Blob([text]), name);
		body.append('options', JSON.stringify(options));
		return session.fetch(`${base}/meshes`, { method: 'POST', body });
	};
	const mapping = { id: 'element', x: 'x', z: 'y', group: 'material' };

	it('previews the header and guesses the mapping (y read as the elevation of a 2D mesh)', async () => {
		const body = new FormData();
		body.append('file', new Blob([meshCsv()]), 'mesh.csv');
		const res = await analyst.fetch(`${base}/meshes/preview`, { method: 'POST', body });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.guess).toEqual({ delimiter: ',', id: 'element', x: 'x', z: 'y', group: 'material' });
		expect(preview.rowCount).toBe(2200);
	});

	it('refuses malformed files naming file, line and column, and stores nothing', async () => {
		const before = (await (await viewer.json('GET', `${base}/meshes`)).json()).meshes.length;
		const cases: [string, number, string][] = [
			[meshCsv().replace('E3,4,4.275', 'E3,4,abc'), 4, 'y'],
			[meshCsv().replace('E5,4,', 'E4,4,'), 6, 'element'],
			[meshCsv().replace('E7,4,', 'E7,,'), 8, 'x']
		];
		for (const [text, line, column] of cases) {
			const res = await upload(analyst, text, { name: `Bad ${line}`, mapping }, 'bad-mesh.csv');
			expect(res.status).toBe(422);
			const err = await errorOf(res);
			expect(err.files?.[0]).toMatchObject({ line, column });
			expect(err.message).toMatch(new RegExp(`^bad-mesh\\.csv: line ${line}, column ${column}: `));
		}
		expect((await (await viewer.json('GET', `${base}/meshes`)).json()).meshes.length).toBe(before);
		expect((await upload(viewer, meshCsv(), { name: 'Viewer', mapping })).status).toBe(403);
		expect((await upload(analyst, meshCsv(), { name: 'No mapping', mapping: { id: 'element' } })).status).toBe(422);
	});

	it('accepts a mesh, once per name under concurrent uploads; a recipe on it exports element ids, CSV = regenerate(), VTK points = CSV', async () => {
		const [a, b] = await Promise.all([upload(analyst, meshCsv(), { name: 'Model mesh', mapping }), upload(analyst, meshCsv(), { name: 'Model mesh', mapping })]);
		expect([a.status, b.status].sort()).toEqual([201, 409]);
		const mesh = (await (a.status === 201 ? a : b).json()).mesh;
		expect(mesh).toMatchObject({ name: 'Model mesh', geometry: '2d', elements: 2200, groups: [{ name: 'upper', elements: 1800 }, { name: 'lower', elements: 400 }] });
		const made = await createRecipe(setup({ name: 'Exports on the mesh', grid: undefined, mesh: { meshId: mesh.id, assign: 'stratigraphy' } }));
		expect(made.provenance.mesh).toMatchObject({ id: mesh.id, elements: 2200, assign: 'stratigraphy' });
		const doc = await documentOf(made.id);
		const records = csvRecords(await (await viewer.fetch(`${base}/recipes/${made.id}/realizations/1.csv`)).text());
		expect(Object.keys(records[0]).slice(0, 5)).toEqual(['element', 'chainage (m)', 'elevation (m)', 'group', 'domain']);
		expect([records[0].element, records[0].group]).toEqual(['E1', 'upper']);
		expectSameBits(simulatedColumn(records, ['suRatio', 'qc1Ncs']), regenerate(doc, 1));
		const m = python('vtk', await bytesOf(await viewer.fetch(`${base}/recipes/${made.id}/realizations/1.vtk`)));
		expect(m.cells).toEqual([['vertex', 2200]]);
		expectSameBits(doubles(m.point_data.qc1Ncs), Float64Array.from(records, (r) => num(r.qc1Ncs)));
		const points = doubles(m.points);
		expect([points[3 * 5], points[3 * 5 + 2]]).toEqual([num(records[5]['chainage (m)']), num(records[5]['elevation (m)'])]);
		// The mesh is the target of a recipe: deleting it is refused until the recipe goes.
		expect((await analyst.json('DELETE', `${base}/meshes/${mesh.id}`)).status).toBe(409);
	});

	it('assigns domains from the mesh’s groups', async () => {
		const mesh = (await (await viewer.json('GET', `${base}/meshes`)).json()).meshes.find((m: { name: string }) => m.name === 'Model mesh');
		const dense = zonation.domains.find((d) => d.name === 'Dense sand')!;
		const made = await createRecipe(
			setup({ name: 'Exports by group', grid: undefined, mesh: { meshId: mesh.id, assign: 'groups', groups: [{ group: 'upper', domainId: null }, { group: 'lower', domainId: dense.id }] } })
		);
		expect(made.provenance.mesh).toMatchObject({ simulated: 400, groups: [{ group: 'upper', domain: null }, { group: 'lower', domain: 'Dense sand' }] });
		const missing = await analyst.json('POST', `${base}/recipes`, setup({ name: 'Exports group missing', grid: undefined, mesh: { meshId: mesh.id, assign: 'groups', groups: [{ group: 'upper', domainId: null }] } }));
		expect(missing.status).toBe(422);
		expect((await errorOf(missing)).message).toMatch(/group lower/);
	});

	it('accepts a file of 2,000,000 elements', async () => {
		const lines = ['id,chainage,elevation'];
		for (let i = 0; i < 2_000_000; i++) lines.push(`${i + 1},${((i % 2000) * 0.2 + 0.1).toFixed(1)},${(-12 + Math.floor(i / 2000) * 0.017).toFixed(3)}`);
		const res = await upload(analyst, lines.join('\n'), { name: 'Two million', mapping: { id: 'id', x: 'chainage', z: 'elevation' } }, 'big-mesh.csv');
		expect(res.status).toBe(201);
		const mesh = (await res.json()).mesh;
		expect(mesh).toMatchObject({ elements: 2_000_000, bounds: { x: [0.1, 399.9] } });
		expect(mesh.bounds.z).toEqual([-12, Number((-12 + 999 * 0.017).toFixed(3))]);
	}, 120_000);
});

describe('export jobs', () => {
	const body = () => ({ recipeId, realizations: '0-3', format: 'csv', maps: ['mean'] });

	it('POST answers 202 {export: {id, status, progress}}; the job runs to done, its file equals export.zip’s bytes, and its creator gets a mail', async () => {
		const res = await viewer.json('POST', `${base}/exports`, body());
		expect(res.status).toBe(202);
		const { export: job } = await res.json();
		expect(job).toMatchObject({ status: expect.stringMatching(/^(queued|running)$/), progress: expect.any(Number) });
		let view = job;
		for (let i = 0; i < 300 && view.status !== 'done'; i++) {
			await new Promise((r) => setTimeout(r, 200));
			view = (await (await viewer.json('GET', `${base}/exports/${job.id}`)).json()).export;
			expect(['queued', 'running', 'done']).toContain(view.status);
		}
		expect(view).toMatchObject({ status: 'done', progress: 1, fileName: 'Riverside-levee-demo_Exports-coarse_r0-3_csv.zip' });
		expect(new Date(view.expiresAt).getTime() - new Date(view.finishedAt).getTime()).toBe(7 * 86_400_000);
		const file = await viewer.fetch(`${base}/exports/${job.id}/download`);
		expect(file.headers.get('content-disposition')).toBe('attachment; filename="Riverside-levee-demo_Exports-coarse_r0-3_csv.zip"');
		const streamed = await bytesOf(await viewer.fetch(`${base}/recipes/${recipeId}/export.zip?realizations=0-3&format=csv&maps=mean`));
		expect(createHash('sha256').update(await bytesOf(file)).digest('hex')).toBe(createHash('sha256').update(streamed).digest('hex'));
		const outbox = await (await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).text();
		expect(outbox).toContain('Export ready: Exports coarse');
		expect((await (await viewer.json('GET', `${base}/exports`)).json()).exports.some((e: { id: string }) => e.id === job.id)).toBe(true);
	}, 120_000);

	it('DELETE cancels a running job (it stays listed, cancelled, with no file); only its creator or an analyst may', async () => {
		// The demo's own recipe: 20 realizations of 34 000 cells take seconds, long enough to cancel.
		const demo = (await (await viewer.json('GET', `${base}/recipes`)).json()).recipes.find((r: { name: string }) => r.name.startsWith('Sand grouped'));
		const { export: job } = await (await viewer.json('POST', `${base}/exports`, { recipeId: demo.id, realizations: '0-19', format: 'vtk' })).json();
		expect((await reviewer.json('DELETE', `${base}/exports/${job.id}`)).status).toBe(403);
		expect((await viewer.json('DELETE', `${base}/exports/${job.id}`)).status).toBe(204);
		let view = job;
		for (let i = 0; i < 100 && view.status !== 'cancelled'; i++) {
			await new Promise((r) => setTimeout(r, 100));
			view = (await (await viewer.json('GET', `${base}/exports/${job.id}`)).json()).export;
		}
		expect(view.status).toBe('cancelled');
		expect((await viewer.fetch(`${base}/exports/${job.id}/download`)).status).toBe(409);
		// A finished (here cancelled) job is deleted by a second DELETE.
		expect((await analyst.json('DELETE', `${base}/exports/${job.id}`)).status).toBe(204);
		expect((await viewer.json('GET', `${base}/exports/${job.id}`)).status).toBe(404);
	});

	it('refuses a malformed body (422), a recipe or realization not there (404), a foreign origin (403), a non-member (404)', async () => {
		expect((await viewer.json('POST', `${base}/exports`, { recipeId, realizations: 'all' })).status).toBe(422);
		expect((await viewer.json('POST', `${base}/exports`, { ...body(), extra: 1 })).status).toBe(422);
		expect((await viewer.json('POST', `${base}/exports`, { ...body(), recipeId: 'nope' })).status).toBe(404);
		expect((await viewer.json('POST', `${base}/exports`, { ...body(), realizations: '0-40' })).status).toBe(404);
		expect((await viewer.fetch(`${base}/exports`, { method: 'POST', headers: { origin: 'https://evil.example', 'content-type': 'text/plain' }, body: JSON.stringify(body()) })).status).toBe(403);
		expect((await admin.json('POST', `${base}/exports`, body())).status).toBe(404);
		expect((await admin.json('GET', `${base}/exports`)).status).toBe(404);
	});
});
