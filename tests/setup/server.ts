/**
 * globalSetup of the vitest 'server' project: starts the BUILT app (node build/index.js) on a free
 * loopback port with a fresh database and data directory, waits until it answers, provides its base URL
 * (`inject('baseUrl')`) and stops it afterwards. Builds first when build/ is missing.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
		dataDir: string;
	}
}

const root = resolve(import.meta.dirname, '..', '..');

export function freePort(): Promise<number> {
	return new Promise((done, reject) => {
		const srv = createServer();
		srv.once('error', reject);
		srv.listen(0, '127.0.0.1', () => {
			const address = srv.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			srv.close(() => done(port));
		});
	});
}

export async function waitUntilReady(url: string, child: ChildProcess, timeoutMs = 60_000): Promise<void> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (child.exitCode !== null) throw new Error(`server exited early with code ${child.exitCode}`);
		try {
			const res = await fetch(`${url}/signin`, { redirect: 'manual' });
			if (res.status === 200) return;
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`server at ${url} did not answer within ${timeoutMs} ms`);
}

export default async function setup(project: TestProject) {
	if (!existsSync(join(root, 'build', 'index.js'))) {
		const built = spawnSync(process.execPath, [join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build'], {
			cwd: root,
			stdio: 'inherit'
		});
		if (built.status !== 0) throw new Error('vite build failed');
	}
	const dataDir = mkdtempSync(join(tmpdir(), 'conefield-test-'));
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	const child = spawn(process.execPath, [join(root, 'build', 'index.js')], {
		cwd: root,
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: baseUrl,
			DATABASE_URL: join(dataDir, 'conefield.db'),
			DATA_DIR: dataDir,
			BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M',
			SMTP_URL: '',
			AUTH_SECRET: '',
			SEED_DEMO: '1'
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let log = '';
	child.stdout?.on('data', (d) => (log += d));
	child.stderr?.on('data', (d) => (log += d));
	try {
		await waitUntilReady(baseUrl, child);
	} catch (err) {
		child.kill('SIGTERM');
		throw new Error(`${(err as Error).message}\n--- server log ---\n${log}`);
	}
	project.provide('baseUrl', baseUrl);
	project.provide('dataDir', dataDir);
	return async () => {
		child.kill('SIGTERM');
		const exited = new Promise((r) => (child.exitCode !== null ? r(null) : child.once('exit', r)));
		// A graceful shutdown waits for open connections; past a few seconds, stop the server outright.
		const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
		await exited;
		clearTimeout(timer);
		if (process.env.CONEFIELD_TEST_LOG) console.log(log);
		rmSync(dataDir, { recursive: true, force: true });
	};
}
