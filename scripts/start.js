#!/usr/bin/env node
// `npm start`: build when build/ is missing or older than any source (the server, then the queue's worker), then
// serve build/index.js.
// PORT (3000), HOST and ORIGIN are honoured; ORIGIN defaults to http://localhost:PORT because
// adapter-node needs it to accept form posts. SEED_DEMO defaults to 1 here (and only here).
import { spawnSync, spawn } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { newest } from './newest.js';
import { fileURLToPath } from 'node:url';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));
process.chdir(root);

const SOURCES = ['src', 'static', 'workers', 'drizzle'];
const CONFIGS = ['package.json', 'package-lock.json', 'svelte.config.js', 'vite.config.ts', 'tsconfig.json'];

const built = join(root, 'build', 'index.js');
const sourcesTime = Math.max(...SOURCES.map((p) => newest(join(root, p))), ...CONFIGS.map((p) => newest(join(root, p))));
if (!existsSync(built) || statSync(built).mtimeMs < sourcesTime) {
	console.log(existsSync(built) ? 'Sources changed; rebuilding…' : 'No build yet; building…');
	const vite = join(root, 'node_modules', 'vite', 'bin', 'vite.js');
	const result = spawnSync(process.execPath, [vite, 'build'], { stdio: 'inherit' });
	if (result.status !== 0) process.exit(result.status ?? 1);
	// vite build empties build/; the queue's worker (`npm run worker`) is built beside the server again.
	const worker = spawnSync(process.execPath, [join(root, 'scripts', 'build-worker.js')], { stdio: 'inherit' });
	if (worker.status !== 0) process.exit(worker.status ?? 1);
}

const port = process.env.PORT ?? '3000';
const env = {
	...process.env,
	PORT: port,
	ORIGIN: process.env.ORIGIN ?? `http://localhost:${port}`,
	// The local quick start seeds the demo accounts into an empty database; `node build/index.js` alone does not.
	SEED_DEMO: process.env.SEED_DEMO ?? '1',
	// CPT uploads reach 50 MB a file; endpoints enforce their own, smaller limits.
	BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M'
};
console.log(`Conefield on ${env.ORIGIN} (demo accounts in README.md)`);
const server = spawn(process.execPath, [built], { stdio: 'inherit', env });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
