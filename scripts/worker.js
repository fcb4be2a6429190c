#!/usr/bin/env node
// `npm run worker`: a worker of the realization queue (workers/queue-worker.ts). Builds build/worker/ first when it
// is missing or older than its sources, then runs it in this process. REDIS_URL is required; WORKER_THREADS,
// WORKER_NAME and WORKER_LOCK_MS are optional (see README, "Running on several machines").
import { existsSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { newest } from './newest.js';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { buildWorker, WORKER_ENTRY } from './build-worker.js';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));

if (!process.env.REDIS_URL?.trim()) {
	console.error('conefield worker: REDIS_URL is not set. Start Redis (e.g. Debian’s redis-server) and run: REDIS_URL=redis://127.0.0.1:6379 npm run worker');
	process.exit(2);
}
const sources = Math.max(...['workers', 'src/lib', 'package-lock.json'].map((p) => newest(join(root, p))));
if (!existsSync(WORKER_ENTRY) || statSync(WORKER_ENTRY).mtimeMs < sources) {
	console.log(existsSync(WORKER_ENTRY) ? 'Worker sources changed; rebuilding…' : 'No worker build yet; building…');
	await buildWorker();
}
await import(pathToFileURL(WORKER_ENTRY).href);
