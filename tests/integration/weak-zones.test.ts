/**
 * Uniform recipes and weak-zone continuity over HTTP against the built server (the weak-zones API is a contract:
 * path and shape exactly as issue 13 gives them). A uniform recipe's values are the domain statistics' declustered
 * percentiles and its realizations one a percentile; the endpoint's per-realization figures equal a labelling
 * written here of the server's own realizations (fetched from the realizations endpoint); the refusals.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');
let analyst: HttpSession;
let viewer: HttpSession;
let admin: HttpSession;
let base: string;
let projectId: string;
let grouped: { id: string; domains: { id: string; name: string; property: string }[] };
let boundary: { id: string; chainageTop: number; elevationTop: number; chainageBottom: number; elevationBottom: number };
/** A project of the analyst's own with a unit and a zone boundary, for the refusals across projects. */
let otherProject: { id: string; boundaryId: string };

const grid = { geometry: '2d', chainage: { from: 0, to: 400, cell: 5 }, elevation: { from: -12, to: 5, cell: 0.5 } };

async function errorOf(res: Response) {
	return ((await res.json()) as { error: { code: string; message: string; issues?: { path: unknown[]; message: string }[] } }).error;
}

async function created(body: unknown): Promise<{ id: string; hash: string; realizations: number; provenance: { domains: { domainId: string; index: number | null; property: string; values?: number[] }[] } }> {
	const res = await analyst.json('POST', base, body);
	if (res.status !== 201 && res.status !== 200) throw new Error(`create failed: ${res.status} ${await res.text()}`);
	return (await res.json()).recipe;
}

/**
 * Weak zones of one section realization by a labelling written here (a queue-based flood fill over the four face
 * neighbours): for each zone its cells and its span of columns.
 */
function label(values: (number | null)[], eligible: boolean[], nx: number, nz: number, threshold: number): number[][] {
	const seen = new Array<boolean>(values.length).fill(false);
	const weak = (c: number) => eligible[c] && values[c] !== null && values[c]! < threshold;
	const zones: number[][] = [];
	for (let s = 0; s < values.length; s++) {
		if (seen[s] || !weak(s)) continue;
		const zone: number[] = [];
		const queue = [s];
		seen[s] = true;
		for (let q = 0; q < queue.length; q++) {
			const c = queue[q];
			zone.push(c);
			const i = c % nx;
			const k = (c - i) / nx;
			const next = [i > 0 ? c - 1 : -1, i < nx - 1 ? c + 1 : -1, k > 0 ? c - nx : -1, k < nz - 1 ? c + nx : -1];
			for (const d of next) if (d >= 0 && !seen[d] && weak(d)) (seen[d] = true), queue.push(d);
		}
		zones.push(zone);
	}
	return zones;
}

beforeAll(async () => {
	[analyst, viewer, admin] = await Promise.all([
		signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password),
		signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password),
		signedInSession(baseUrl, DEMO.admin.email, DEMO.admin.password)
	]);
	const { projects } = (await (await analyst.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	base = `/api/v1/projects/${projectId}/recipes`;
	const { zonations } = await (await viewer.json('GET', `/api/v1/projects/${projectId}/zonations`)).json();
	grouped = zonations.find((z: { name: string }) => z.name === 'Sand grouped');
	boundary = (await (await viewer.json('GET', `/api/v1/projects/${projectId}/zone-boundaries`)).json()).boundaries[0];
	const made = await analyst.json('POST', '/api/v1/projects', { name: `Weak zones elsewhere ${crypto.randomUUID().slice(0, 6)}` });
	const otherId = (await made.json()).project.id as string;
	const unit = await (await analyst.json('POST', `/api/v1/projects/${otherId}/units`, { name: 'Sand', property: 'qc1Ncs' })).json();
	const line = { unitId: unit.unit.id, chainageTop: 10, elevationTop: 0, chainageBottom: 12, elevationBottom: -10 };
	const made2 = await analyst.json('POST', `/api/v1/projects/${otherId}/zone-boundaries`, line);
	if (made2.status !== 201) throw new Error(`zone boundary: ${made2.status} ${await made2.text()}`);
	otherProject = { id: otherId, boundaryId: (await made2.json()).boundary.id };
}, 120_000);

describe('uniform recipes over HTTP', () => {
	it('POST {kind: uniform} stores one realization a percentile; each value is the declustered percentile the samples endpoint’s statistics give', async () => {
		const recipe = await created({ kind: 'uniform', name: 'HTTP baseline', zonationId: grouped.id, percentiles: [10, 50, 90], grid, domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true })) });
		expect(recipe.realizations).toBe(3);
		for (const d of recipe.provenance.domains) {
			const { stats } = await (await viewer.json('GET', `/api/v1/projects/${projectId}/domains/${d.domainId}/samples`)).json();
			expect(d.values).toEqual([stats.p10, stats.p50, stats.p90]);
		}
		const doc = JSON.parse(await (await viewer.fetch(`${base}/${recipe.id}/recipe.json`)).text());
		expect([doc.kind, doc.realizations, doc.input.percentiles]).toEqual(['uniform', 3, [10, 50, 90]]);
		const r1 = (await (await viewer.json('GET', `${base}/${recipe.id}/realizations/1`)).json()).values as (number | null)[];
		const sand = recipe.provenance.domains.find((d) => d.property === 'qc1Ncs' && d.index !== null)!;
		expect(new Set(r1.filter((v) => v !== null))).toContain(sand.values![1]);
		expect((await viewer.json('GET', `${base}/${recipe.id}/realizations/3`)).status).toBe(404);
	});

	it('refuses a uniform setup with a seed, a percentile of 100, or no percentile (422 with issues)', async () => {
		const body = { kind: 'uniform', name: 'Bad baseline', zonationId: grouped.id, grid, domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true })) };
		for (const extra of [{ seed: '1' }, { percentiles: [50, 100] }, { percentiles: [] }]) {
			const res = await analyst.json('POST', base, { ...body, ...extra });
			expect(res.status, JSON.stringify(extra)).toBe(422);
			expect((await errorOf(res)).issues!.length).toBeGreaterThan(0);
		}
		expect((await analyst.json('POST', base, { ...body, kind: 'other' })).status).toBe(422);
	});
});

describe('GET /api/v1/projects/:id/recipes/:rid/weak-zones', () => {
	let recipe: Awaited<ReturnType<typeof created>>;
	let url: string;

	beforeAll(async () => {
		recipe = await created({ name: 'HTTP weak zones', zonationId: grouped.id, seed: 'weak-http', realizations: 4, grid, domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true })) });
		url = `${base}/${recipe.id}/weak-zones`;
	}, 120_000);

	it('answers exactly the contract’s shape', async () => {
		const res = await viewer.json('GET', `${url}?property=qc1Ncs&threshold=100&minLength=20&boundary=${boundary.id}`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(Object.keys(body).sort()).toEqual(['crossingProbability', 'domains', 'minLength', 'probabilityMap', 'property', 'realizations', 'threshold']);
		expect([body.property, body.threshold, body.minLength]).toEqual(['qc1Ncs', 100, 20]);
		expect(body.realizations).toHaveLength(4);
		for (const r of body.realizations) expect(Object.keys(r).sort()).toEqual(['crossesBoundary', 'largestArea', 'largestExtent', 'realization', 'zones']);
		expect(body.probabilityMap).toHaveLength(80 * 34);
	});

	it('each realization’s figures equal a labelling written here of the server’s own realization; the map and crossing probability follow', async () => {
		const body = await (await viewer.json('GET', `${url}?property=qc1Ncs&threshold=100&minLength=20&boundary=${boundary.id}`)).json();
		const domains = recipe.provenance.domains.filter((d) => d.index !== null && d.property === 'qc1Ncs').map((d) => d.index!);
		expect(body.domains).toEqual([...domains].sort((a, b) => a - b));
		const doc = JSON.parse(await (await viewer.fetch(`${base}/${recipe.id}/recipe.json`)).text());
		const domainOf: number[] = doc.targets.domainRuns.flatMap(([d, n]: [number, number]) => new Array(n).fill(d));
		const eligible = domainOf.map((d) => domains.includes(d));
		const [nx, nz] = [80, 34];
		// Which side of the boundary line each cell centre lies on (1: at or east of the line at its elevation).
		const side = domainOf.map((_, c) => {
			const x = 2.5 + 5 * (c % nx);
			const z = -11.75 + 0.5 * Math.floor(c / nx);
			const t = (boundary.elevationTop - z) / (boundary.elevationTop - boundary.elevationBottom);
			return boundary.chainageTop + t * (boundary.chainageBottom - boundary.chainageTop) <= x ? 1 : 0;
		});
		const hits = new Array<number>(nx * nz).fill(0);
		let crossings = 0;
		for (let r = 0; r < 4; r++) {
			const values = (await (await viewer.json('GET', `${base}/${recipe.id}/realizations/${r}`)).json()).values as (number | null)[];
			const zones = label(values, eligible, nx, nz, 100);
			const extents = zones.map((z) => {
				const cols = z.map((c) => c % nx);
				return (Math.max(...cols) - Math.min(...cols) + 1) * 5;
			});
			const crosses = zones.some((z) => z.some((c) => side[c] === 0) && z.some((c) => side[c] === 1));
			expect(body.realizations[r]).toEqual({
				realization: r,
				zones: zones.length,
				largestExtent: Math.max(0, ...extents),
				largestArea: Math.max(0, ...zones.map((z) => z.length)) * 5 * 0.5,
				crossesBoundary: crosses
			});
			if (crosses) crossings++;
			zones.forEach((z, k) => {
				if (extents[k] >= 20) for (const c of z) hits[c]++;
			});
		}
		expect(body.crossingProbability).toBe(crossings / 4);
		expect(body.probabilityMap).toEqual(hits.map((h, c) => (eligible[c] ? h / 4 : null)));
		expect(body.realizations.some((r: { zones: number }) => r.zones > 0)).toBe(true);
	});

	it('without a boundary, crossesBoundary and crossingProbability are null; minLength defaults to 0', async () => {
		const body = await (await viewer.json('GET', `${url}?property=qc1Ncs&threshold=100`)).json();
		expect(body.minLength).toBe(0);
		expect(body.crossingProbability).toBeNull();
		expect(body.realizations.every((r: { crossesBoundary: unknown }) => r.crossesBoundary === null)).toBe(true);
	});

	it('refuses a missing or non-numeric threshold, a negative minLength, an unknown property, one the recipe does not simulate, and a foreign boundary (422)', async () => {
		for (const q of ['property=qc1Ncs', 'property=qc1Ncs&threshold=abc', 'property=qc1Ncs&threshold=Infinity', 'property=qc1Ncs&threshold=100&minLength=-1', 'property=qc1Ncs&threshold=100&minLength=1e999', 'property=nope&threshold=1', 'property=Dr&threshold=50', 'property=qc1Ncs&threshold=100&boundary=nope']) {
			const res = await viewer.json('GET', `${url}?${q}`);
			expect(res.status, q).toBe(422);
			expect((await errorOf(res)).code).toBe('invalid');
		}
	});

	it('refuses without a session (401), with a bad token (401), to a non-member (404), and a recipe of another project or none (404)', async () => {
		const q = '?property=qc1Ncs&threshold=100';
		expect((await new HttpSession(baseUrl).json('GET', url + q)).status).toBe(401);
		expect((await new HttpSession(baseUrl).json('GET', url + q, undefined, { authorization: 'Bearer cf_bad' })).status).toBe(401);
		expect((await admin.json('GET', url + q)).status).toBe(404);
		expect((await viewer.json('GET', `${base}/${crypto.randomUUID()}/weak-zones${q}`)).status).toBe(404);
		// The analyst's own project: the demo recipe is not in it, whatever the analyst may read elsewhere.
		const other = await analyst.json('GET', `/api/v1/projects/${otherProject.id}/recipes/${recipe.id}/weak-zones${q}`);
		expect(other.status).toBe(404);
		expect((await errorOf(other)).code).toBe('not_found');
	});

	it('refuses a zone boundary of another project (422 naming the boundary), though the caller may read that project', async () => {
		const res = await analyst.json('GET', `${url}?property=qc1Ncs&threshold=100&boundary=${otherProject.boundaryId}`);
		expect(res.status).toBe(422);
		expect((await errorOf(res)).issues!.map((i) => i.path.join('.'))).toEqual(['boundary']);
	});

	it('a uniform baseline on an uploaded mesh: its values per element are the domains’ percentiles; weak zones are refused (422: not a grid)', async () => {
		const rows = ['element,x,y'];
		for (let c = 0; c < 20; c++) for (let k = 0; k < 10; k++) rows.push(`E${c}-${k},${10 + 20 * c},${(-0.5 - k).toFixed(1)}`);
		const body = new FormData();
		body.append('file', new Blob([rows.join('\n') + '\n']), 'baseline-mesh.csv');
		body.append('options', JSON.stringify({ name: `Baseline mesh ${crypto.randomUUID().slice(0, 6)}`, mapping: { id: 'element', x: 'x', z: 'y' } }));
		const up = await analyst.fetch(`/api/v1/projects/${projectId}/meshes`, { method: 'POST', body });
		expect(up.status).toBe(201);
		const mesh = (await up.json()).mesh;
		const made = await created({ kind: 'uniform', name: 'Baseline on the mesh', zonationId: grouped.id, percentiles: [50], mesh: { meshId: mesh.id, assign: 'stratigraphy' }, domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true })) });
		const doc = JSON.parse(await (await viewer.fetch(`${base}/${made.id}/recipe.json`)).text());
		expect(doc.targets.kind).toBe('points');
		const values = (await (await viewer.json('GET', `${base}/${made.id}/realizations/0`)).json()).values as (number | null)[];
		doc.targets.domain.forEach((d: number, e: number) => {
			const p = made.provenance.domains.find((x) => x.index === d);
			expect(values[e]).toBe(p ? p.values![0] : null);
		});
		const res = await viewer.json('GET', `${base}/${made.id}/weak-zones?property=qc1Ncs&threshold=100`);
		expect(res.status).toBe(422);
		expect((await errorOf(res)).message).toMatch(/elements of a mesh/);
	});

	it('a viewer may read it (reading is the viewer capability); the same query twice is the same answer from the cache', async () => {
		const q = `?property=qc1Ncs&threshold=90&minLength=10&boundary=${boundary.id}`;
		const [a, b] = await Promise.all([viewer.json('GET', url + q), analyst.json('GET', url + q)]);
		expect([a.status, b.status]).toEqual([200, 200]);
		const first = await a.json();
		expect(await b.json()).toEqual(first);
		expect(await (await viewer.json('GET', url + q)).json()).toEqual(first);
	});
});
