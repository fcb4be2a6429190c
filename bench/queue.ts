// "queue-block": 8 realizations of the 1,000,000-cell block (bench/simulation.ts's block: 100 × 100 × 100 cells at
// 2 × 2 × 0.25 m, 25 soundings, exponential 40 m / 1.5 m, 16 data and 16 nodes) regenerated
//   - "queue-block:in-process": on the server's own pool of worker threads, as the in-process runner does (2 threads:
//     this machine's cores);
//   - "queue-block:1-worker" and "queue-block:2-workers": through the realization queue (Debian's redis-server on a
//     loopback port, worker processes from the built entry, WORKER_THREADS=1 each) and read back in order by the
//     server's side of the queue, as an export job reads them.
// Two workers of one thread each against the in-process pool of two threads is the fair comparison on a 2-core box.
// Figures: wall seconds; the workers' own compute (prepare + regenerate, from the jobs' results); the queue's
// overhead per job: within each job what is not computing (fetching the recipe, writing its 8 MB, progress), plus the
// gap between a worker finishing a job and starting the next that was waiting, from BullMQ's own timestamps, and its
// share of a realization's compute time; the wall overhead per job = (wall × threads − compute) / jobs, which also
// charges a worker's idle time at the end (when the other still works on the last range) to the queue; the
// server's serial share per realization: reading it from Redis (GETDEL and copy), and an estimate of writing it as
// CSV (String() of each value and its coordinates, deflated at level 6, as a CSV export's ZIP does). Wall clock, not
// CPU time: the work runs in other processes. Needs redis-server; builds the worker when build/worker is missing.
import { deflateRawSync } from 'node:zlib';
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import { createRecipe, type Recipe } from '../src/lib/geostat/index';
import { createNodePool } from '../workers/node-pool';
import { QueueRealizations } from '../src/lib/server/queue/realizations';
import { PREFIX, QUEUE_NAME, bufferToValues, valuesToBuffer, type RangeJobData, type RangeJobResult } from '../src/lib/server/queue/protocol';
import { startRedis, startWorker, stopAll, type TestWorker } from '../tests/setup/queue';
import { blockInput } from './simulation';
import type { BenchCase } from './index';

const N = 8;
const round = (x: number, d = 2) => Number(x.toFixed(d));

function blockRecipe(): Recipe {
	const { input } = blockInput();
	// The same 1,000,000 points as the benchmark's block (its z runs 0 … −24.75 m), as a grid definition.
	return createRecipe(input, { kind: 'grid', origin: { x: 0, y: 0, z: -24.75 }, spacing: { x: 2, y: 2, z: 0.25 }, counts: { x: 100, y: 100, z: 100 }, domainRuns: [[0, 1_000_000]] }, { realizations: N });
}

let recipe: Recipe | null = null;
const theRecipe = () => (recipe ??= blockRecipe());
const list = Array.from({ length: N }, (_, r) => r);

/** An estimate of formatting one realization of the block as CSV rows and deflating them (ms). */
function csvEstimateMs(values: Float64Array): number {
	const t0 = performance.now();
	const parts: string[] = [];
	let chunk = '';
	for (let i = 0; i < values.length; i++) {
		const ix = i % 100;
		const j = Math.floor(i / 100) % 100;
		const k = Math.floor(i / 10_000);
		chunk += `${i},${ix},${j},${k},${ix * 2},${j * 2},${-24.75 + k * 0.25},Block,${values[i]}\r\n`;
		if (chunk.length > 1 << 16) {
			parts.push(chunk);
			chunk = '';
		}
	}
	parts.push(chunk);
	deflateRawSync(Buffer.from(parts.join('')), { level: 6 });
	return performance.now() - t0;
}

/** The server's read of one realization of the block: GETDEL of its 8 MB and the copy into a Float64Array (ms, median of 5). */
async function readMs(client: Redis, values: Float64Array): Promise<number> {
	const times: number[] = [];
	for (let k = 0; k < 5; k++) {
		await client.set('conefield:bench:read', valuesToBuffer(values));
		const t0 = performance.now();
		bufferToValues((await client.getdelBuffer('conefield:bench:read'))!, values.length);
		times.push(performance.now() - t0);
	}
	return times.sort((a, b) => a - b)[2];
}

async function throughQueue(workerCount: number): Promise<Record<string, number>> {
	const redis = await startRedis();
	const workers: TestWorker[] = [];
	const q = new QueueRealizations(redis.url);
	const client = new Redis(redis.url, { maxRetriesPerRequest: null });
	client.on('error', () => undefined);
	const jobs = new Queue<RangeJobData, RangeJobResult>(QUEUE_NAME, { connection: client, prefix: PREFIX });
	try {
		for (let w = 0; w < workerCount; w++) workers.push(await startWorker(redis.url, `bench-${w + 1}`, { WORKER_LOCK_MS: '30000' }));
		while ((await q.workers()).length < workerCount) await new Promise((r) => setTimeout(r, 100));
		const started = performance.now();
		let first: Float64Array | null = null;
		for await (const [r, values] of q.stream({ recipe: theRecipe() }, list)) if (r === 0) first = values;
		const wallMs = performance.now() - started;
		const completed = await jobs.getJobs(['completed']);
		const done = completed.map((j) => j.returnvalue);
		const computeMs = done.reduce((s, r) => s + r.prepareMs + r.realizeMs, 0);
		const wallOverheadPerJobMs = (wallMs * workerCount - computeMs) / done.length;
		const realizationMs = computeMs / N;
		// The queue's own cost per job: inside the job, what is not computing (fetching the recipe, writing 8 MB,
		// progress), plus the gap between a worker finishing a job and starting the next one that was already waiting.
		let inJob = 0;
		let gaps = 0;
		const byWorker = new Map<string, typeof completed>();
		for (const j of completed) byWorker.set(j.returnvalue.worker, [...(byWorker.get(j.returnvalue.worker) ?? []), j]);
		for (const j of completed) inJob += j.finishedOn! - j.processedOn! - (j.returnvalue.prepareMs + j.returnvalue.realizeMs);
		for (const list of byWorker.values()) {
			list.sort((a, b) => a.processedOn! - b.processedOn!);
			for (let k = 1; k < list.length; k++) gaps += Math.max(0, list[k].processedOn! - Math.max(list[k - 1].finishedOn!, list[k].timestamp));
		}
		const overheadPerJobMs = (inJob + gaps) / done.length;
		return {
			workers: workerCount,
			threadsPerWorker: 1,
			realizations: N,
			jobs: done.length,
			seconds: round(wallMs / 1000),
			computeSeconds: round(computeMs / 1000),
			realizationSeconds: round(realizationMs / 1000),
			overheadPerJobMs: round(overheadPerJobMs, 0),
			overheadShare: round(overheadPerJobMs / realizationMs, 4),
			wallOverheadPerJobMs: round(wallOverheadPerJobMs, 0),
			wallOverheadShare: round(wallOverheadPerJobMs / realizationMs, 4),
			serverReadMsPerRealization: round(await readMs(client, first!), 1),
			serverCsvMsPerRealization: round(csvEstimateMs(first!), 0)
		};
	} finally {
		await q.close();
		await jobs.close();
		client.disconnect();
		await Promise.all(workers.map((w) => w.stop()));
		await redis.stop();
		await stopAll();
	}
}

const cases: BenchCase[] = [
	{
		name: 'queue-block:in-process',
		async run() {
			const pool = createNodePool({ size: 2 });
			try {
				const started = performance.now();
				await pool.runRecipe(theRecipe(), list, { keep: false, onRealization: () => undefined });
				const wallMs = performance.now() - started;
				return { threads: 2, realizations: N, seconds: round(wallMs / 1000), realizationSeconds: round((wallMs * 2) / N / 1000) };
			} finally {
				await pool.close();
			}
		}
	},
	{ name: 'queue-block:1-worker', run: () => throughQueue(1) },
	{ name: 'queue-block:2-workers', run: () => throughQueue(2) }
];

export default cases;
