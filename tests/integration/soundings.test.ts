/**
 * Soundings over HTTP against the built server: upload of each demo format (multipart), the mapping preview,
 * refused files naming file, line and column with nothing stored, re-uploads recognised, the 50 MB limit and
 * the role rule (viewer reads, analyst uploads and deletes).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, signedInSession, type HttpSession } from '../setup';

const baseUrl = inject('baseUrl');
const DEMO_DIR = join(import.meta.dirname, '..', '..', 'static', 'demo');

interface FileSpec {
	name: string;
	bytes: Uint8Array;
}
interface SoundingJson {
	id: string;
	name: string;
	readings: number;
	maxDepth: number;
	groundElevation: number;
	sourceFile: { name: string; format: string } | null;
}
interface ErrorJson {
	code: string;
	message: string;
	issues?: { path: (string | number)[]; message: string }[];
	files?: { file: string; code: string; message: string; line?: number; column?: string }[];
}

const demoFile = (path: string): FileSpec => ({ name: path.split('/').pop()!, bytes: new Uint8Array(readFileSync(join(DEMO_DIR, path))) });
const textFile = (name: string, text: string): FileSpec => ({ name, bytes: new TextEncoder().encode(text) });

function form(files: FileSpec[], options?: unknown, field = 'files'): FormData {
	const body = new FormData();
	for (const f of files) body.append(field, new Blob([f.bytes as BlobPart]), f.name);
	if (options !== undefined) body.append('options', JSON.stringify(options));
	return body;
}

const upload = (s: HttpSession, projectId: string, files: FileSpec[], options?: unknown) =>
	s.fetch(`/api/v1/projects/${projectId}/soundings`, { method: 'POST', body: form(files, options) });

async function list(s: HttpSession, projectId: string): Promise<SoundingJson[]> {
	const res = await s.json('GET', `/api/v1/projects/${projectId}/soundings`);
	expect(res.status).toBe(200);
	return ((await res.json()) as { soundings: SoundingJson[] }).soundings;
}

async function errorOf(res: Response): Promise<ErrorJson> {
	return ((await res.json()) as { error: ErrorJson }).error;
}

let analyst: HttpSession;
let viewer: HttpSession;
let demoId: string;

async function newProject(name: string): Promise<string> {
	const res = await analyst.json('POST', '/api/v1/projects', { name, description: '', lengthUnit: 'm' });
	expect(res.status).toBe(201);
	return ((await res.json()) as { project: { id: string } }).project.id;
}

const GEF_BAD_CELL =
	'#GEFID= 1, 1, 0\n#TESTID= BAD-1\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n' +
	'#COLUMNINFO= 3, MPa, local friction, 3\n#ZID= 0, 2, 0\n#EOH=\n0.1 1.0 0.01\n0.2 x1 0.01\n';

beforeAll(async () => {
	analyst = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	viewer = await signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password);
	const res = await analyst.json('GET', '/api/v1/projects');
	demoId = ((await res.json()) as { projects: { id: string; name: string }[] }).projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
});

describe('the seeded demo project', () => {
	it('GET /soundings lists the 25 demo soundings from their GEF files, for a viewer too', async () => {
		const soundings = await list(viewer, demoId);
		expect(soundings.map((s) => s.name)).toEqual(Array.from({ length: 25 }, (_, i) => `LV-${String(i + 1).padStart(2, '0')}`));
		expect(soundings.every((s) => s.sourceFile?.format === 'gef' && s.readings > 700)).toBe(true);
	});

	it('GET /soundings/[sid] returns the measured columns and the derived arrays of equal length', async () => {
		const [first] = await list(viewer, demoId);
		const res = await viewer.json('GET', `/api/v1/projects/${demoId}/soundings/${first.id}`);
		expect(res.status).toBe(200);
		const body = (await res.json()) as {
			sounding: { name: string };
			columns: Record<string, (number | null)[] | null>;
			derived: Record<string, (number | null)[]>;
			unit: number[];
			units: unknown[];
		};
		expect(body.sounding.name).toBe('LV-01');
		const n = first.readings;
		for (const key of ['depth', 'qc', 'fs', 'u2']) expect(body.columns[key]?.length, key).toBe(n);
		for (const key of ['qt', 'sigmaVeff', 'Ic', 'qc1Ncs', 'suRatio']) expect(body.derived[key]?.length, key).toBe(n);
		expect(body.unit).toHaveLength(n);
	});

	it('POST /soundings refuses a re-upload of a demo GEF file as already imported (409)', async () => {
		const res = await upload(analyst, demoId, [demoFile('gef/LV-04.gef')]);
		expect(res.status).toBe(409);
		const err = await errorOf(res);
		expect(err.code).toBe('conflict');
		expect(err.files?.[0]).toMatchObject({ file: 'LV-04.gef', code: 'already-imported' });
		expect(err.message).toContain('already imported');
		expect(await list(analyst, demoId)).toHaveLength(25);
	});

	it('a viewer may not upload (403) nor delete (403)', async () => {
		const up = await upload(viewer, demoId, [textFile('v.gef', GEF_BAD_CELL)]);
		expect(up.status).toBe(403);
		expect((await errorOf(up)).code).toBe('forbidden');
		const [first] = await list(viewer, demoId);
		const del = await viewer.json('DELETE', `/api/v1/projects/${demoId}/soundings/${first.id}`);
		expect(del.status).toBe(403);
	});
});

describe('uploading each demo format into a new project', () => {
	it('POST /soundings/preview then POST /soundings imports the demo CSV with the confirmed mapping', async () => {
		const id = await newProject('CSV import');
		const csv = demoFile('levee-cpt.csv');
		const pre = await analyst.fetch(`/api/v1/projects/${id}/soundings/preview?rows=5`, { method: 'POST', body: form([csv], undefined, 'file') });
		expect(pre.status).toBe(200);
		const { preview } = (await pre.json()) as { preview: { headers: string[]; rows: string[][]; rowCount: number; guess: Record<string, unknown> } };
		expect(preview.rows).toHaveLength(5);
		expect(preview.guess).toMatchObject({ id: 'sounding', depth: 'depth (m)', qc: 'qc (MPa)' });
		const res = await upload(analyst, id, [csv], { mappings: { 'levee-cpt.csv': preview.guess } });
		expect(res.status).toBe(201);
		const body = (await res.json()) as { files: { format: string; soundings: unknown[] }[] };
		expect(body.files[0]).toMatchObject({ format: 'delimited' });
		expect(body.files[0].soundings).toHaveLength(25);
		const soundings = await list(analyst, id);
		const demo = await list(analyst, demoId);
		expect(soundings.map((s) => [s.name, s.readings, s.groundElevation])).toEqual(demo.map((s) => [s.name, s.readings, s.groundElevation]));
	});

	it('POST /soundings imports several GEF files in one upload', async () => {
		const id = await newProject('GEF import');
		const res = await upload(analyst, id, [demoFile('gef/LV-01.gef'), demoFile('gef/LV-02.gef'), demoFile('gef/LV-03.gef')]);
		expect(res.status).toBe(201);
		expect((await list(analyst, id)).map((s) => s.name)).toEqual(['LV-01', 'LV-02', 'LV-03']);
	});

	it('POST /soundings imports the demo AGS4 file, then recognises the same bytes again (409)', async () => {
		const id = await newProject('AGS import');
		const ags = demoFile('levee-cpt.ags');
		const res = await upload(analyst, id, [ags]);
		expect(res.status).toBe(201);
		expect(await list(analyst, id)).toHaveLength(25);
		const again = await upload(analyst, id, [{ ...ags, name: 'copy.ags' }]);
		expect(again.status).toBe(409);
		expect((await errorOf(again)).files?.[0].message).toContain('already imported (as levee-cpt.ags');
	});

	it('DELETE /soundings/[sid] removes a sounding (204), after which GET answers 404', async () => {
		const id = await newProject('Delete');
		await upload(analyst, id, [demoFile('gef/LV-09.gef')]);
		const [s] = await list(analyst, id);
		const del = await analyst.json('DELETE', `/api/v1/projects/${id}/soundings/${s.id}`);
		expect(del.status).toBe(204);
		expect((await analyst.json('GET', `/api/v1/projects/${id}/soundings/${s.id}`)).status).toBe(404);
		expect(await list(analyst, id)).toEqual([]);
	});
});

describe('bad files: a clear error naming file, line and column, and nothing stored', () => {
	let id: string;
	beforeAll(async () => {
		id = await newProject('Bad files');
	});

	const mapping = { id: 'id', depth: 'depth', qc: 'qc', fs: 'fs', units: { depth: 'm', qc: 'MPa', fs: 'kPa' }, groundElevation: { value: 1 } };
	const cases: { kind: string; file: FileSpec; options?: unknown; code: string; line?: number; column?: string }[] = [
		{ kind: 'a non-numeric cell', file: textFile('cell.gef', GEF_BAD_CELL), code: 'not-a-number', line: 10, column: 'cone resistance' },
		{ kind: 'an unknown unit', file: textFile('unit.gef', GEF_BAD_CELL.replace('2, MPa, cone', '2, psi, cone')), code: 'unknown-unit', line: 5, column: 'cone resistance' },
		{ kind: 'depth not increasing', file: textFile('down.csv', 'id,depth,qc,fs\nA,1,2,20\nA,0.5,2,20\n'), options: { mapping }, code: 'depth-not-increasing', line: 3, column: 'depth' },
		{ kind: 'a missing required column', file: textFile('nofs.csv', 'id,depth,qc\nA,1,2\n'), options: { mapping }, code: 'missing-column', line: 1, column: 'fs' },
		{ kind: 'an empty file', file: textFile('empty.csv', ''), options: { mapping }, code: 'empty-file', line: 1 },
		{ kind: 'a binary file', file: { name: 'blob.gef', bytes: Uint8Array.from([0x47, 0x45, 0x46, 0x00, 0xff, 0x10]) }, code: 'binary-file', line: 1 }
	];
	for (const c of cases) {
		it(`POST /soundings refuses ${c.kind} with 422 naming the file${c.line ? `, line ${c.line}` : ''}${c.column ? ` and column ${c.column}` : ''}`, async () => {
			const res = await upload(analyst, id, [c.file], c.options);
			expect(res.status).toBe(422);
			const err = await errorOf(res);
			expect(err.code).toBe('invalid');
			expect(err.files).toHaveLength(1);
			expect(err.files![0]).toMatchObject({ file: c.file.name, code: c.code });
			expect(err.files![0].line).toBe(c.line);
			expect(err.files![0].column).toBe(c.column);
			expect(err.message).toContain(c.file.name);
			if (c.line) expect(err.message).toContain(`line ${c.line}`);
			expect(err.message).toContain('Nothing was imported');
			expect(await list(analyst, id)).toEqual([]);
		});
	}

	it('POST /soundings stores nothing when one file of an upload is bad', async () => {
		const res = await upload(analyst, id, [demoFile('gef/LV-11.gef'), textFile('cell.gef', GEF_BAD_CELL)]);
		expect(res.status).toBe(422);
		expect((await errorOf(res)).files?.map((f) => f.file)).toEqual(['cell.gef']);
		expect(await list(analyst, id)).toEqual([]);
		// The good file alone goes in afterwards: nothing of the refused upload was kept.
		expect((await upload(analyst, id, [demoFile('gef/LV-11.gef')])).status).toBe(201);
	});

	it('POST /soundings refuses a file over 50 MB with 413 naming it', async () => {
		const big = { name: 'huge.csv', bytes: new Uint8Array(50 * 1024 * 1024 + 1).fill(0x20) };
		const res = await upload(analyst, id, [big], { mapping });
		expect(res.status).toBe(413);
		const err = await errorOf(res);
		expect(err.code).toBe('payload_too_large');
		expect(err.files?.[0]).toMatchObject({ file: 'huge.csv', code: 'file-too-large' });
	});

	it('POST /soundings answers 422 for invalid upload options and 400 for a body that is not multipart', async () => {
		const bad = await upload(analyst, id, [textFile('x.csv', 'a,b\n1,2\n')], { mapping: { depth: 'a' } });
		expect(bad.status).toBe(422);
		expect((await errorOf(bad)).issues?.length).toBeGreaterThan(0);
		const json = await analyst.json('POST', `/api/v1/projects/${id}/soundings`, { files: [] });
		expect(json.status).toBe(400);
	});
});
