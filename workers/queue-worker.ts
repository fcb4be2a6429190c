/// <reference path="./comlink-node-adapter.d.ts" />
/**
 * The queue's worker process (`npm run worker`; built to build/worker/queue-worker.js): connects to Redis at
 * REDIS_URL and regenerates the realization ranges the web server queues (see queue-work.ts and
 * src/lib/server/queue/protocol.ts). Stateless: it never opens the database; everything it needs comes from Redis.
 * Start as many as you like on any machine that reaches Redis.
 *
 * Environment: REDIS_URL (required); WORKER_THREADS, simulation threads and so jobs at once (default: the machine's
 * available parallelism); WORKER_NAME (default host:pid); WORKER_LOCK_MS, how long a job's lock lasts without renewal,
 * i.e. how soon the job of a worker that died is given to another (default 30 000).
 *
 * SIGTERM or SIGINT: takes no more jobs, finishes the ones it has, then exits; a second signal exits at once (its
 * jobs go back to the queue when their locks expire).
 */
import { availableParallelism, endianness, hostname } from 'node:os';
import { Worker } from 'bullmq';
import { createNodePool } from './node-pool';
import { rangeProcessor } from './queue-work';
import { PREFIX, QUEUE_NAME, TTL, connect, keys, redisAddress, type RangeJobData, type RangeJobResult, type WorkerBeat } from '../src/lib/server/queue/protocol';

function fail(message: string): never {
	console.error(`conefield worker: ${message}`);
	process.exit(2);
}

const url = process.env.REDIS_URL?.trim();
if (!url) fail('REDIS_URL is not set. Start Redis (e.g. Debian’s redis-server) and run: REDIS_URL=redis://127.0.0.1:6379 npm run worker');
if (endianness() !== 'LE') fail('this machine is big-endian; realizations travel as little-endian doubles.');
const threadsEnv = process.env.WORKER_THREADS;
const threads = threadsEnv ? Number(threadsEnv) : Math.max(1, availableParallelism());
if (!Number.isInteger(threads) || threads < 1 || threads > 256) fail(`WORKER_THREADS must be a whole number from 1 to 256 (got “${threadsEnv}”).`);
const lockMs = Number(process.env.WORKER_LOCK_MS ?? 30_000);
if (!Number.isFinite(lockMs) || lockMs < 1000) fail('WORKER_LOCK_MS must be at least 1000.');
const name = process.env.WORKER_NAME?.trim() || `${hostname()}:${process.pid}`;
const log = (line: string) => console.log(`[worker ${name}] ${line}`);

// The bundled worker (build/worker) runs the bundled simulation thread beside it; from the TypeScript source the pool
// loads simulation.node-worker.ts through tsx.
const bundled = import.meta.url.endsWith('.js');
const workerUrl = bundled ? new URL('./simulation.node-worker.js', import.meta.url) : undefined;
const slots = Array.from({ length: threads }, () => createNodePool({ size: 1, workerUrl }));

const redis = connect(url, `conefield-worker-${name}`);
redis.on('error', () => undefined);
const { process: processRange, stats } = rangeProcessor({ redis, slots, name, log });

const worker = new Worker<RangeJobData, RangeJobResult>(QUEUE_NAME, processRange, {
	connection: connect(url, `conefield-worker-${name}-jobs`),
	prefix: PREFIX,
	concurrency: threads,
	name,
	lockDuration: lockMs,
	stalledInterval: Math.max(500, Math.round(lockMs / 2)),
	// A job whose worker died goes back to the queue; after the third time it counts as failed.
	maxStalledCount: 2,
	autorun: true
});
let lastError = '';
worker.on('error', (err) => {
	if (err.message !== lastError) log(`Redis: ${err.message}`);
	lastError = err.message;
});
worker.on('failed', (job, err) => job && log(`job ${job.id} failed (attempt ${job.attemptsMade}): ${err.message}`));

const startedAt = new Date().toISOString();
const beat = () => {
	const b: WorkerBeat = { id: name, host: hostname(), pid: process.pid, threads, startedAt, lastSeen: new Date().toISOString(), jobs: stats.jobs, busy: stats.busy };
	redis.set(keys.worker(name), JSON.stringify(b), 'EX', TTL.worker).catch(() => undefined);
};
beat();
const heart = setInterval(beat, 5000);

log(`connected to ${redisAddress(url)}: ${threads} simulation thread${threads === 1 ? '' : 's'}, lock ${lockMs} ms`);

let stopping = false;
async function shutdown(signal: string): Promise<void> {
	if (stopping) {
		log(`${signal} again: exiting now; unfinished jobs return to the queue when their locks expire`);
		process.exit(1);
	}
	stopping = true;
	log(`${signal}: finishing ${stats.busy} job(s), taking no more`);
	await worker.close();
	clearInterval(heart);
	await redis.del(keys.worker(name)).catch(() => undefined);
	redis.disconnect();
	await Promise.all(slots.map((s) => s.close()));
	log('stopped');
	process.exit(0);
}
process.on('SIGTERM', () => void shutdown('SIGTERM'));
process.on('SIGINT', () => void shutdown('SIGINT'));
