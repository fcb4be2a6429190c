// Exports against the BUILT server (run `npx vite build` first), started on a free loopback port with the demo:
//
// "export-section": the demo recipe's 20 realizations (400 × 85 cells at 1 m × 0.2 m) as a CSV ZIP streamed by
//   export.zip: seconds and MB/s (of the ZIP, and of the CSV inside it before compression); and one realization of a
//   48,000-cell grid of the same section (0.7 m × 0.2 m cells) as CSV: the time to the first bytes, to the first data
//   row, and to the whole file.
// "export-mesh": one realization on a 1,000,000-element mesh as CSV (a structured mesh over the demo section whose
//   cells are 0.05 m tall above −4 m and 0.114 m below, so no regular lattice: the engine's general path): seconds,
//   the server's peak RSS during the export (VmHWM of a server started afresh for it, so the upload and the recipe's
//   creation are left out), and the latency of GET /api/v1/projects asked every 25 ms meanwhile (median, 95th
//   percentile, largest) against the same GET when idle.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { freePort, waitUntilReady } from '../tests/setup/server';
import { DEMO, DEMO_PROJECT_NAME, signedInSession, type HttpSession } from '../tests/setup';
import type { BenchCase } from './index';

const root = resolve(import.meta.dirname, '..');
const round = (x: number, d = 2) => Number(x.toFixed(d));
const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))];

interface Server {
	baseUrl: string;
	child: ChildProcess;
	owner: HttpSession;
	project: string;
}

async function startServer(dataDir: string): Promise<Server> {
	if (!existsSync(join(root, 'build', 'index.js'))) throw new Error('build first: npx vite build');
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	const child = spawn(process.execPath, [join(root, 'build', 'index.js')], {
		cwd: root,
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: baseUrl, DATABASE_URL: join(dataDir, 'c.db'), DATA_DIR: dataDir, SEED_DEMO: '1', SMTP_URL: '', BODY_SIZE_LIMIT: '210M' },
		stdio: 'ignore'
	});
	await waitUntilReady(baseUrl, child);
	const owner = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	const { projects } = (await (await owner.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	return { baseUrl, child, owner, project: projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id };
}

/** Reads a response to the end: bytes, and when the first bytes and the first CSV data row arrived (ms after `t0`). */
async function drain(res: Response, t0: number): Promise<{ bytes: number; firstByteMs: number; firstRowMs: number; ms: number }> {
	const reader = res.body!.getReader();
	let bytes = 0;
	let firstByteMs = NaN;
	let firstRowMs = NaN;
	let newlines = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		if (Number.isNaN(firstByteMs)) firstByteMs = performance.now() - t0;
		bytes += value.byteLength;
		if (Number.isNaN(firstRowMs)) {
			for (const b of value) if (b === 10 && ++newlines === 2) firstRowMs = performance.now() - t0;
		}
	}
	return { bytes, firstByteMs, firstRowMs, ms: performance.now() - t0 };
}

async function zipInflatedBytes(bytes: Uint8Array): Promise<number> {
	// The uncompressed sizes from the ZIP's central directory: each entry's "central file header" (PK\x01\x02) holds them.
	let total = 0;
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	for (let i = 0; i + 46 <= bytes.length; i++) {
		if (view.getUint32(i, true) !== 0x02014b50) continue;
		let size = view.getUint32(i + 24, true);
		const nameLength = view.getUint16(i + 28, true);
		const extraLength = view.getUint16(i + 30, true);
		// Zip64: the size in the extra field.
		if (size === 0xffffffff) {
			for (let e = i + 46 + nameLength; e < i + 46 + nameLength + extraLength; ) {
				const id = view.getUint16(e, true);
				const len = view.getUint16(e + 2, true);
				if (id === 1) size = Number(view.getBigUint64(e + 4, true));
				e += 4 + len;
			}
		}
		total += size;
		i += 45 + nameLength + extraLength;
	}
	return total;
}

async function section(): Promise<Record<string, number>> {
	const dataDir = mkdtempSync(join(tmpdir(), 'conefield-bench-'));
	const s = await startServer(dataDir);
	try {
		const base = `/api/v1/projects/${s.project}`;
		const { recipes } = (await (await s.owner.json('GET', `${base}/recipes`)).json()) as { recipes: { id: string; name: string; zonationId: string }[] };
		const demo = recipes.find((r) => r.name.startsWith('Sand split at channel'))!;
		// Warm the pool (workers start and load the engine) outside the timings.
		await (await s.owner.fetch(`${base}/recipes/${demo.id}/realizations/0.csv`)).arrayBuffer();
		let t0 = performance.now();
		const zipRes = await s.owner.fetch(`${base}/recipes/${demo.id}/export.zip?realizations=0-19&format=csv`);
		const zip = new Uint8Array(await zipRes.arrayBuffer());
		const zipMs = performance.now() - t0;
		const inflated = await zipInflatedBytes(zip);

		// A 48,000-cell grid of the same section, one realization as CSV.
		const view = (await (await s.owner.json('GET', `${base}/recipes/${demo.id}`)).json()).recipe;
		const setup = { ...view.setup, name: 'Bench 48k', realizations: 1, grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 0.7 }, elevation: { from: -12, to: 5, cell: 0.2 } } };
		const made = await s.owner.json('POST', `${base}/recipes`, setup);
		const big = (await made.json()).recipe as { id: string; provenance: { grid: { cells: number } } };
		t0 = performance.now();
		const one = await drain(await s.owner.fetch(`${base}/recipes/${big.id}/realizations/0.csv`), t0);
		return {
			realizations: 20,
			zipSeconds: round(zipMs / 1000),
			zipMB: round(zip.length / 1e6),
			zipMBps: round(zip.length / 1e6 / (zipMs / 1000)),
			csvMB: round(inflated / 1e6),
			csvMBps: round(inflated / 1e6 / (zipMs / 1000)),
			cells48k: big.provenance.grid.cells,
			firstBytesMs48k: Math.round(one.firstByteMs),
			firstRowMs48k: Math.round(one.firstRowMs),
			wholeCsvMs48k: Math.round(one.ms),
			csvMB48k: round(one.bytes / 1e6)
		};
	} finally {
		s.child.kill('SIGKILL');
		rmSync(dataDir, { recursive: true, force: true });
	}
}

/** 4000 columns 0.1 m wide × 250 rows: 180 rows 0.05 m tall from +5 to −4, 70 rows of 8/70 m below. */
function meshCsv(): string {
	const lines = ['element,chainage,elevation'];
	let n = 0;
	for (let c = 0; c < 4000; c++) {
		const x = (0.05 + c * 0.1).toFixed(2);
		for (let r = 0; r < 250; r++) {
			const z = r < 180 ? 5 - 0.025 - r * 0.05 : -4 - (r - 180 + 0.5) * (8 / 70);
			lines.push(`${++n},${x},${z.toFixed(4)}`);
		}
	}
	return lines.join('\n');
}

function peakRss(pid: number): number {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	return Number(/VmHWM:\s+(\d+) kB/.exec(status)![1]) * 1024;
}

async function mesh(): Promise<Record<string, number>> {
	const dataDir = mkdtempSync(join(tmpdir(), 'conefield-bench-'));
	let s = await startServer(dataDir);
	try {
		const base = `/api/v1/projects/${s.project}`;
		const body = new FormData();
		body.append('file', new Blob([meshCsv()]), 'million.csv');
		body.append('options', JSON.stringify({ name: 'Million', mapping: { id: 'element', x: 'chainage', z: 'elevation' } }));
		let t0 = performance.now();
		const up = await s.owner.fetch(`${base}/meshes`, { method: 'POST', body });
		if (up.status !== 201) throw new Error(`mesh upload answered ${up.status}: ${(await up.text()).slice(0, 300)}`);
		const uploadMs = performance.now() - t0;
		const meshId = (await up.json()).mesh.id;
		const { recipes } = (await (await s.owner.json('GET', `${base}/recipes`)).json()) as { recipes: { id: string; name: string }[] };
		const view = (await (await s.owner.json('GET', `${base}/recipes/${recipes.find((r) => r.name.startsWith('Sand split at channel'))!.id}`)).json()).recipe;
		t0 = performance.now();
		const made = await s.owner.json('POST', `${base}/recipes`, { ...view.setup, name: 'Bench million', realizations: 1, grid: undefined, mesh: { meshId, assign: 'stratigraphy' } });
		if (made.status !== 201) throw new Error(`recipe answered ${made.status}: ${(await made.text()).slice(0, 300)}`);
		const recipeMs = performance.now() - t0;
		const recipe = (await made.json()).recipe as { id: string; provenance: { mesh: { simulated: number } } };

		// A fresh server for the export alone, so its peak RSS is the export's.
		s.child.kill('SIGKILL');
		s = await startServer(dataDir);
		const get = async () => {
			const t = performance.now();
			await (await s.owner.json('GET', '/api/v1/projects')).arrayBuffer();
			return performance.now() - t;
		};
		const idle: number[] = [];
		for (let i = 0; i < 40; i++) idle.push(await get());
		const rssBefore = peakRss(s.child.pid!);
		t0 = performance.now();
		let done = false;
		const exported = s.owner.fetch(`${base}/recipes/${recipe.id}/realizations/0.csv`).then(async (res) => {
			const r = await drain(res, t0);
			done = true;
			return r;
		});
		const during: number[] = [];
		while (!done) {
			during.push(await get());
			await new Promise((r) => setTimeout(r, 25));
		}
		const csv = await exported;
		return {
			elements: 1_000_000,
			simulated: recipe.provenance.mesh.simulated,
			uploadSeconds: round(uploadMs / 1000),
			recipeSeconds: round(recipeMs / 1000),
			seconds: round(csv.ms / 1000),
			firstBytesMs: Math.round(csv.firstByteMs),
			csvMB: round(csv.bytes / 1e6),
			peakRssMB: Math.round(peakRss(s.child.pid!) / 1e6),
			idlePeakRssMB: Math.round(rssBefore / 1e6),
			getsDuring: during.length,
			getMedianMs: round(quantile(during, 0.5), 1),
			getP95Ms: round(quantile(during, 0.95), 1),
			getMaxMs: round(Math.max(...during), 1),
			idleGetMedianMs: round(quantile(idle, 0.5), 1)
		};
	} finally {
		s.child.kill('SIGKILL');
		rmSync(dataDir, { recursive: true, force: true });
	}
}

export default [
	{ name: 'export-section', run: section },
	{ name: 'export-mesh', run: mesh }
] satisfies BenchCase[];
