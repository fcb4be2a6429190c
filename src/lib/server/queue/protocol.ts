/**
 * What the web server and the queue's workers (workers/queue-worker.ts) agree on: the BullMQ queue, the Redis keys,
 * a range job's data and result, and how realizations travel. Shared by both sides, so it imports nothing of the
 * server (relative imports only: the worker's bundle and the benchmarks load it without the app's aliases).
 *
 * The protocol, in one paragraph: the server stores a recipe's canonical JSON under its hash (`SET … NX` with a TTL it
 * refreshes while it uses it) and a run key that says the run is still wanted, then adds range jobs {run, hash,
 * realizations}. A worker fetches the recipe by hash (checking the hash), regenerates the realizations on its own
 * threads and writes each one whole, as its Float64 values, under its own key with a TTL; the server reads them in
 * realization order and deletes each as it takes it. Nothing is ever appended, so a retried or duplicated job can
 * only write the same bytes again.
 */
import { Buffer } from 'node:buffer';
import { Redis, type RedisOptions } from 'ioredis';

/** The BullMQ queue of realization ranges. */
export const QUEUE_NAME = 'realizations';

/** Prefix of every key Conefield writes to Redis (BullMQ's keys included). */
export const PREFIX = 'conefield';

/** A range job: realizations of a recipe to regenerate. */
export interface RangeJobData {
	/** The run (one stream of realizations on the server) the results belong to. */
	run: string;
	/** SHA-256 of the recipe's canonical JSON; the recipe is at `keys.recipe(hash)`. */
	hash: string;
	/** Realization numbers, in order. */
	realizations: number[];
}

/** What a range job returns. */
export interface RangeJobResult {
	/** Realizations written. */
	written: number;
	/** Milliseconds spent preparing the recipe (0 when the worker had it prepared) and regenerating. */
	prepareMs: number;
	realizeMs: number;
	/** Set when the run was no longer wanted (cancelled, finished, or its key lost) and nothing was written. */
	skipped?: 'run-ended';
	/** The worker that did it. */
	worker: string;
}

/** Progress a worker reports on a range job: realization r is `fraction` done (1 once its values are written). */
export interface RangeProgress {
	r: number;
	fraction: number;
}

/** A worker's heartbeat, kept at `keys.worker(id)` with a short TTL. */
export interface WorkerBeat {
	id: string;
	host: string;
	pid: number;
	threads: number;
	startedAt: string;
	lastSeen: string;
	/** Range jobs finished since it started. */
	jobs: number;
	/** Range jobs it is working on now. */
	busy: number;
}

export const keys = {
	recipe: (hash: string) => `${PREFIX}:recipe:${hash}`,
	run: (run: string) => `${PREFIX}:run:${run}`,
	result: (run: string, r: number) => `${PREFIX}:out:${run}:${r}`,
	worker: (id: string) => `${PREFIX}:worker:${id}`,
	workers: `${PREFIX}:worker:*`
};

/** Lifetimes in Redis, in seconds. */
export const TTL = {
	/** A recipe's document; refreshed while a run uses it. */
	recipe: 3600,
	/** A run's key; refreshed every RUN_REFRESH_MS while the server still reads the run. */
	run: 60,
	/** A realization's values waiting to be read. */
	result: 1800,
	/** A worker's heartbeat; refreshed every 5 s. */
	worker: 20
};

/** How often the server refreshes its run and recipe keys. */
export const RUN_REFRESH_MS = 10_000;

/** Retries of a range job: BullMQ's attempts and backoff. */
export const JOB_ATTEMPTS = 3;
export const JOB_BACKOFF_MS = 1000;

/**
 * Options of every connection: commands wait while Redis is away and run once it is back (`maxRetriesPerRequest:
 * null`, as BullMQ's workers require), reconnecting every 0.1 … 2 s; callers bound the wait themselves.
 */
export function connect(url: string, name: string): Redis {
	const options: RedisOptions = {
		maxRetriesPerRequest: null,
		connectionName: name,
		retryStrategy: (times) => Math.min(100 * times, 2000),
		lazyConnect: false
	};
	return new Redis(url, options);
}

/** REDIS_URL without its password, for messages and logs. */
export function redisAddress(url: string): string {
	try {
		const u = new URL(url);
		return `${u.protocol}//${u.hostname}${u.port ? `:${u.port}` : ''}${u.pathname && u.pathname !== '/' ? u.pathname : ''}`;
	} catch {
		return 'REDIS_URL';
	}
}

/**
 * A realization's values as the bytes stored in Redis: the Float64Array's own memory (IEEE 754 binary64,
 * little-endian: the worker refuses to start on a big-endian machine), no copy.
 */
export function valuesToBuffer(values: Float64Array): Buffer {
	return Buffer.from(values.buffer, values.byteOffset, values.byteLength);
}

/**
 * The values back from Redis's bytes (copied into an aligned Float64Array).
 * @throws {RangeError} when the length is not a whole number of doubles, or not `expected` values
 */
export function bufferToValues(buffer: Buffer, expected?: number): Float64Array {
	if (buffer.byteLength % 8 !== 0) throw new RangeError(`stored values of ${buffer.byteLength} bytes are not whole doubles`);
	const n = buffer.byteLength / 8;
	if (expected !== undefined && n !== expected) throw new RangeError(`stored values hold ${n} values, expected ${expected}`);
	const out = new Float64Array(n);
	new Uint8Array(out.buffer).set(buffer);
	return out;
}

/**
 * Realizations per range job for a recipe of `targets` targets: one for large grids (a realization of a million
 * cells is tens of seconds, and one a job spreads them evenly over the workers), up to four for small ones, so a
 * job's fixed cost (a few Redis round trips, a few milliseconds) stays small beside its work.
 */
export function rangeSize(targets: number): number {
	return Math.max(1, Math.min(4, Math.floor(250_000 / Math.max(1, targets))));
}

/** Consecutive ranges of a list of realizations, `size` a range, in order. */
export function splitRanges(list: number[], size: number): number[][] {
	const out: number[][] = [];
	for (let k = 0; k < list.length; k += size) out.push(list.slice(k, k + size));
	return out;
}
