// A GET's latency while the server imports a large upload: starts the BUILT server (run `npx vite build`
// first) on a free loopback port, uploads one CSV of 10 soundings × 100 000 readings (1 000 000 rows,
// the per-sounding limit) and meanwhile asks for GET /api/v1/projects every 25 ms. Prints the import's time and
// the GETs' latency (median, 95th percentile, largest) during it, and the same GET's latency when idle.
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { freePort, waitUntilReady } from '../tests/setup/server';
import { DEMO, signedInSession } from '../tests/setup';
import type { BenchCase } from './index';

const root = resolve(import.meta.dirname, '..');
const SOUNDINGS = 10;
const READINGS = 100_000;

function bigCsv(): string {
	const lines = ['sounding,depth (m),qc (MPa),fs (kPa),u2 (kPa)'];
	for (let s = 0; s < SOUNDINGS; s++) {
		for (let i = 1; i <= READINGS; i++) lines.push(`BIG-${s},${(i * 0.001).toFixed(3)},${(1 + ((i * 7919) % 1000) / 100).toFixed(3)},${((i * 104729) % 2000) / 10},${(i * 0.00981).toFixed(3)}`);
	}
	return lines.join('\n');
}

const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))];
const round = (x: number) => Math.round(x * 10) / 10;

async function run(): Promise<Record<string, number>> {
	if (!existsSync(join(root, 'build', 'index.js'))) throw new Error('build first: npx vite build');
	const dataDir = mkdtempSync(join(tmpdir(), 'conefield-bench-'));
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	const server = spawn(process.execPath, [join(root, 'build', 'index.js')], {
		cwd: root,
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: baseUrl, DATABASE_URL: join(dataDir, 'c.db'), DATA_DIR: dataDir, SEED_DEMO: '1', SMTP_URL: '', BODY_SIZE_LIMIT: '210M' },
		stdio: 'ignore'
	});
	try {
		await waitUntilReady(baseUrl, server);
		const owner = await signedInSession(baseUrl, DEMO.owner.email, DEMO.owner.password);
		const project = ((await (await owner.json('POST', '/api/v1/projects', { name: 'Latency bench' })).json()) as { project: { id: string } }).project.id;
		const get = async () => {
			const t = performance.now();
			await (await owner.json('GET', '/api/v1/projects')).arrayBuffer();
			return performance.now() - t;
		};
		const idle: number[] = [];
		for (let i = 0; i < 40; i++) idle.push(await get());

		const body = new FormData();
		body.append('files', new Blob([bigCsv()]), 'big.csv');
		body.append('options', JSON.stringify({ mapping: { id: 'sounding', depth: 'depth (m)', qc: 'qc (MPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)', units: { depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' }, groundElevation: { value: 2 } } }));
		const started = performance.now();
		let done = false;
		const upload = owner.fetch(`/api/v1/projects/${project}/soundings`, { method: 'POST', body }).then(async (res) => {
			done = true;
			if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${(await res.text()).slice(0, 300)}`);
			return performance.now() - started;
		});
		const during: number[] = [];
		while (!done) {
			during.push(await get());
			await new Promise((r) => setTimeout(r, 25));
		}
		const importMs = await upload;
		return {
			importMs: Math.round(importMs),
			rows: SOUNDINGS * READINGS,
			getsDuringImport: during.length,
			getMedianMs: round(quantile(during, 0.5)),
			getP95Ms: round(quantile(during, 0.95)),
			getMaxMs: round(Math.max(...during)),
			idleGetMedianMs: round(quantile(idle, 0.5))
		};
	} finally {
		server.kill('SIGKILL');
		rmSync(dataDir, { recursive: true, force: true });
	}
}

export default [{ name: 'import-latency', run }] satisfies BenchCase[];
