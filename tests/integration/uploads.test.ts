/**
 * Uploads and what they carry (issue 11: Low 6, Medium 5, Low 8): scripts upload with a bearer token and no
 * Origin while cookie sessions keep the CSRF check; coordinates, elevations, depths, sounding names and the
 * number of readings are held to the bounds of src/lib/schemas/bounds.ts at every entry point; a file named
 * like a built-in object member is mapped like any other; readings come in pages.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, signedInSession, type HttpSession } from '../setup';

const baseUrl = inject('baseUrl');
const LV01 = readFileSync(join(import.meta.dirname, '..', '..', 'static', 'demo', 'gef', 'LV-01.gef'), 'utf8');

interface ErrorJson {
	code: string;
	message: string;
	issues?: { path: (string | number)[]; message: string }[];
	files?: { file: string; code: string; message: string; column?: string }[];
}

/** LV-01 renamed (each test needs its own sounding name and bytes), with header lines replaced as given. */
function gef(name: string, replace: Record<string, string> = {}): string {
	let text = LV01.replace('#TESTID= LV-01', `#TESTID= ${name}`);
	for (const [key, line] of Object.entries(replace)) text = text.replace(new RegExp(`^#${key}=.*$`, 'm'), line);
	return text;
}

function multipart(files: { name: string; text: string }[], options?: unknown): FormData {
	const body = new FormData();
	for (const f of files) body.append('files', new Blob([f.text]), f.name);
	if (options !== undefined) body.append('options', JSON.stringify(options));
	return body;
}

const errorOf = async (res: Response) => ((await res.json()) as { error: ErrorJson }).error;

let analyst: HttpSession;
let projectId: string;
let token: string;

beforeAll(async () => {
	analyst = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	const owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
	projectId = ((await (await owner.json('POST', '/api/v1/projects', { name: 'Upload tests' })).json()) as { project: { id: string } }).project.id;
	await owner.json('POST', `/api/v1/projects/${projectId}/members`, { email: DEMO.analyst.email, role: 'analyst' });
	const admin = await signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password);
	const outbox = await (await admin.fetch('/admin/outbox', { headers: { accept: 'text/html' } })).text();
	const invite = /href="[^"]*(\/invitations\/[^"]+)"/.exec(outbox)![1];
	expect((await analyst.form(`${invite}?/accept`, {}, 'text/html')).status).toBe(303);
	const created = await analyst.json('POST', '/api/v1/account/tokens', { name: 'upload script', expiresInDays: 7 });
	token = ((await created.json()) as { token: string }).token;
});

const soundingsUrl = () => new URL(`/api/v1/projects/${projectId}/soundings`, baseUrl);

describe('the CSRF origin check', () => {
	it('a bearer-token upload without an Origin header is imported (as curl sends it)', async () => {
		const res = await fetch(soundingsUrl(), { method: 'POST', headers: { authorization: `Bearer ${token}` }, body: multipart([{ name: 'tok-1.gef', text: gef('TOK-1') }]) });
		expect(res.status).toBe(201);
		expect(((await res.json()) as { files: { soundings: { name: string }[] }[] }).files[0].soundings[0].name).toBe('TOK-1');
	});

	it('a bearer-token upload from a foreign origin is imported too: a token is not a cookie a page could ride on', async () => {
		const res = await fetch(soundingsUrl(), {
			method: 'POST',
			headers: { authorization: `Bearer ${token}`, origin: 'https://elsewhere.example' },
			body: multipart([{ name: 'tok-2.gef', text: gef('TOK-2') }])
		});
		expect(res.status).toBe(201);
	});

	it('the README’s curl upload works as written', async () => {
		const readme = readFileSync(join(import.meta.dirname, '..', '..', 'README.md'), 'utf8');
		const command = /^curl [^\n]*\\\n(?:[^\n]*\\\n)*[^\n]*\/soundings$/m.exec(readme)?.[0];
		expect(command, 'a curl upload in README.md').toBeTruthy();
		const dir = mkdtempSync(join(tmpdir(), 'conefield-curl-'));
		try {
			writeFileSync(join(dir, 'CPT-01.gef'), gef('README-1'));
			writeFileSync(join(dir, 'CPT-02.gef'), gef('README-2'));
			const script = `${command!.replaceAll('http://localhost:3000', baseUrl)} -s -w '\\n%{http_code}'`;
			const out = execFileSync('sh', ['-c', script], { cwd: dir, env: { ...process.env, TOKEN: token, PROJECT: projectId }, encoding: 'utf8' });
			const status = out.trim().split('\n').pop();
			expect(status, out).toBe('201');
			expect(out).toContain('README-2');
		} finally {
			rmSync(dir, { recursive: true, force: true });
		}
	});

	it('a bad token without an Origin header answers 401 in the API’s error shape', async () => {
		const res = await fetch(soundingsUrl(), { method: 'POST', headers: { authorization: 'Bearer cf_made-up' }, body: multipart([{ name: 'x.gef', text: gef('X') }]) });
		expect(res.status).toBe(401);
		expect((await errorOf(res)).code).toBe('unauthorized');
	});

	it('a cookie-session upload without an Origin, or from a foreign one, answers 403 in the API’s error shape', async () => {
		for (const origin of [null, 'https://elsewhere.example']) {
			const headers: Record<string, string> = { cookie: analyst.cookieHeader() };
			if (origin) headers.origin = origin;
			const res = await fetch(soundingsUrl(), { method: 'POST', headers, body: multipart([{ name: 'cookie.gef', text: gef('COOKIE') }]) });
			expect(res.status).toBe(403);
			const error = await errorOf(res);
			expect(error.code).toBe('forbidden');
			expect(error.message).toContain('Origin');
		}
		const list = (await (await analyst.json('GET', `/api/v1/projects/${projectId}/soundings`)).json()) as { soundings: { name: string }[] };
		expect(list.soundings.map((s) => s.name)).not.toContain('COOKIE');
	});

	it('a cross-site form post to a page still answers 403', async () => {
		const res = await fetch(new URL('/projects/new?/create', baseUrl), {
			method: 'POST',
			headers: { cookie: analyst.cookieHeader(), origin: 'https://elsewhere.example', 'content-type': 'application/x-www-form-urlencoded' },
			body: 'name=Forged'
		});
		expect(res.status).toBe(403);
	});
});

describe('bounds on what locates a sounding', () => {
	const upload = (files: { name: string; text: string }[], options?: unknown) =>
		analyst.fetch(`/api/v1/projects/${projectId}/soundings`, { method: 'POST', body: multipart(files, options) });

	it.each([
		['a huge easting', { XYID: '#XYID= 0, 1e160, 0, 0, 0' }, 'x'],
		['a huge northing', { XYID: '#XYID= 0, 0, -2e8, 0, 0' }, 'y'],
		['a ground elevation above any land', { ZID: '#ZID= 0, 1e6, 0' }, 'ground elevation']
	])('a GEF file with %s is refused with 422, naming the column, and nothing is stored', async (_label, replace, column) => {
		const res = await upload([{ name: `far-${column}.gef`, text: gef(`FAR-${column}`, replace) }]);
		expect(res.status).toBe(422);
		const error = await errorOf(res);
		expect(error.files![0]).toMatchObject({ code: 'out-of-bounds', column });
		expect(error.message).toContain('outside');
	});

	it('a fallback ground elevation out of bounds is refused with 422 before any file is read', async () => {
		const res = await upload([{ name: 'noz.gef', text: gef('NOZ', { ZID: '' }) }], { defaults: { groundElevation: 1e300 } });
		expect(res.status).toBe(422);
		expect((await errorOf(res)).issues![0].path).toEqual(['defaults', 'groundElevation']);
	});

	it('PATCH …/site with a section line or groundwater out of bounds answers 422 and keeps the stored settings', async () => {
		const owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
		const site = `/api/v1/projects/${projectId}/site`;
		expect((await owner.json('PATCH', site, { sectionLine: [[0, 0], [100, 0]] })).status).toBe(200);
		for (const body of [{ sectionLine: [[0, 0], [1e308, 1e308]] }, { sectionLine: [[0, 0], [2e8, 0]] }, { groundwaterElevation: -1e9 }, { offLineTolerance: 1e300 }]) {
			const res = await owner.json('PATCH', site, body);
			expect(res.status, JSON.stringify(body)).toBe(422);
			expect((await errorOf(res)).code).toBe('invalid');
		}
		const now = (await (await owner.json('GET', site)).json()) as { site: { sectionLine: number[][] } };
		expect(now.site.sectionLine).toEqual([[0, 0], [100, 0]]);
		// With the line set, every listing that projects soundings onto it still answers.
		expect((await analyst.json('GET', `/api/v1/projects/${projectId}/soundings`)).status).toBe(200);
		expect((await analyst.json('GET', `/api/v1/projects/${projectId}/section`)).status).toBe(200);
	});

	it('a contact or zone boundary out of bounds answers 422', async () => {
		const contact = await analyst.json('PUT', `/api/v1/projects/${projectId}/contacts`, { soundingId: 'x', unitId: 'y', topElevation: 1e12 });
		expect(contact.status).toBe(422);
		const boundary = await analyst.json('POST', `/api/v1/projects/${projectId}/zone-boundaries`, {
			unitId: 'u', chainageTop: 1e300, elevationTop: 1, chainageBottom: 0, elevationBottom: 0
		});
		expect(boundary.status).toBe(422);
	});
});

describe('limits on what a file may hold', () => {
	const upload = (files: { name: string; text: string }[], options?: unknown) =>
		analyst.fetch(`/api/v1/projects/${projectId}/soundings`, { method: 'POST', body: multipart(files, options) });
	const MAPPING = {
		id: 'sounding',
		depth: 'depth (m)',
		qc: 'qc (MPa)',
		fs: 'fs (kPa)',
		units: { depth: 'm', qc: 'MPa', fs: 'kPa' },
		groundElevation: { value: 1 }
	};
	const csv = (rows: number, name = 'C-1') =>
		['sounding,depth (m),qc (MPa),fs (kPa)', ...Array.from({ length: rows }, (_, i) => `${name},${((i + 1) * 0.001).toFixed(3)},1.5,10`)].join('\n');

	it('a sounding name over 100 characters, or without a visible character, is refused with 422', async () => {
		const long = await upload([{ name: 'long-name.gef', text: gef('L'.repeat(100_000)) }]);
		expect(long.status).toBe(422);
		expect((await errorOf(long)).files![0].code).toBe('name-too-long');
		const invisible = await upload([{ name: 'invisible.csv', text: csv(3, '\u200b\u200c') }], { mapping: MAPPING });
		expect(invisible.status).toBe(422);
		expect((await errorOf(invisible)).files![0].code).toBe('no-visible-name');
	});

	it('a sounding of more than 100 000 readings is refused with 413, naming the limit', async () => {
		const res = await upload([{ name: 'long.csv', text: csv(100_001, 'LONG') }], { mapping: MAPPING });
		expect(res.status).toBe(413);
		const error = await errorOf(res);
		expect(error.files![0].code).toBe('too-many-readings');
		expect(error.message).toContain('100,000');
	});

	it.each(['toString', 'constructor', 'hasOwnProperty', '__proto__'])('a delimited file named %s takes the upload’s mapping like any other', async (name) => {
		// Per-file mappings for the other file, the upload-wide one for this: its lookup must not find Object.prototype.toString.
		const res = await upload([{ name, text: csv(5, `M-${name}`) }, { name: 'other.csv', text: csv(5, `O-${name}`) }], { mappings: { 'other.csv': MAPPING }, mapping: MAPPING });
		expect(res.status).toBe(201);
		expect(((await res.json()) as { files: { name: string }[] }).files.map((f) => f.name)).toEqual([name, 'other.csv']);
	});
});

describe('readings in pages', () => {
	it('GET …/soundings/:sid pages with offset and limit; the pages together are the whole sounding', async () => {
		const list = (await (await analyst.json('GET', `/api/v1/projects/${projectId}/soundings`)).json()) as { soundings: { id: string; name: string; readings: number }[] };
		const s = list.soundings.find((x) => x.name === 'TOK-1')!;
		const whole = (await (await analyst.json('GET', `/api/v1/projects/${projectId}/soundings/${s.id}`)).json()) as {
			readings: { total: number; count: number; next: string | null };
			columns: { depth: number[] };
			derived: { Ic: (number | null)[] };
		};
		expect(whole.readings).toMatchObject({ total: s.readings, count: s.readings, next: null });
		const depth: number[] = [];
		const ic: (number | null)[] = [];
		let next: string | null = `/api/v1/projects/${projectId}/soundings/${s.id}?limit=300`;
		let pages = 0;
		while (next) {
			const page = (await (await analyst.json('GET', next)).json()) as typeof whole;
			depth.push(...page.columns.depth);
			ic.push(...page.derived.Ic);
			next = page.readings.next;
			pages++;
		}
		expect(pages).toBe(Math.ceil(s.readings / 300));
		expect(depth).toEqual(whole.columns.depth);
		expect(ic).toEqual(whole.derived.Ic);
	});

	it('a limit above 100 000 or a negative offset answers 422', async () => {
		const list = (await (await analyst.json('GET', `/api/v1/projects/${projectId}/soundings`)).json()) as { soundings: { id: string }[] };
		const id = list.soundings[0].id;
		expect((await analyst.json('GET', `/api/v1/projects/${projectId}/soundings/${id}?limit=100001`)).status).toBe(422);
		expect((await analyst.json('GET', `/api/v1/projects/${projectId}/soundings/${id}?offset=-1`)).status).toBe(422);
	});
});
