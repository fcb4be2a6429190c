/**
 * The realization queue, when REDIS_URL is set: started once at the server's start (hooks.server.ts), used by
 * realizations.ts for every regeneration (downloads, summaries, export jobs) and by export-jobs.ts for its runner.
 * Without REDIS_URL nothing here runs and the server makes realizations on its own worker threads.
 */
import { availableParallelism, hostname } from 'node:os';
import { realizationQueue, useRealizationQueue } from '../realizations';
import { QueueRealizations, type QueueState } from './realizations';

/** REDIS_URL, or null when the queue is off. */
export function queueUrl(env: Record<string, string | undefined> = process.env): string | null {
	const v = env.REDIS_URL?.trim();
	return v ? v : null;
}

function seconds(env: Record<string, string | undefined>, name: string, fallback: number): number {
	const v = Number(env[name]);
	return Number.isFinite(v) && v > 0 ? v * 1000 : fallback * 1000;
}

/** Exports the web server writes at once with the queue (QUEUE_EXPORTS_AT_ONCE, default 2). */
export function exportsAtOnce(env: Record<string, string | undefined> = process.env): number {
	const v = Number(env.QUEUE_EXPORTS_AT_ONCE);
	return Number.isInteger(v) && v > 0 ? v : 2;
}

/**
 * Connects to the queue when REDIS_URL is set and makes it the source of realizations. Does not wait for Redis:
 * the server starts while Redis is away, and work waits for it (up to QUEUE_REDIS_GRACE_SECONDS).
 */
export function startQueue(env: Record<string, string | undefined> = process.env): QueueRealizations | null {
	const url = queueUrl(env);
	if (!url) return null;
	const q = new QueueRealizations(url, {
		graceMs: seconds(env, 'QUEUE_REDIS_GRACE_SECONDS', 60),
		noWorkerMs: seconds(env, 'QUEUE_NO_WORKER_SECONDS', 60)
	});
	useRealizationQueue(q);
	console.info(`[conefield] realizations are made by the queue's workers (REDIS_URL ${q.address}).`);
	return q;
}

/** Closes the queue's connections (shutdown). */
export async function stopQueue(): Promise<void> {
	const q = realizationQueue();
	useRealizationQueue(null);
	await q?.close();
}

/** The health endpoint's answer. */
export interface QueueHealth {
	runner: 'in-process' | 'bullmq';
	/** Redis's address (no password) and connection state; absent in process. */
	redis?: { address: string; status: string };
	/** Realization ranges (bullmq) or export jobs (in process) waiting, running, and failed in the last 24 hours. */
	waiting: number;
	active: number;
	failed: number;
	/** Export jobs queued and being written by this server. */
	exports: { waiting: number; active: number };
	/** The queue's workers with a live heartbeat; in process, this server. */
	workers: { id: string; host: string; pid: number; threads: number; busy: number; jobs: number; lastSeen: string }[];
	/** Why the counts are missing (Redis not answering). */
	error?: string;
}

/**
 * The queue as the health endpoint shows it. Redis not answering within `timeoutMs` gives the state without counts
 * and an error, rather than a request that hangs.
 */
export async function queueHealth(exportsNow: { waiting: number; active: number }, failedExports: number, timeoutMs = 2000): Promise<QueueHealth> {
	const q = realizationQueue();
	if (!q) {
		return {
			runner: 'in-process',
			waiting: exportsNow.waiting,
			active: exportsNow.active,
			failed: failedExports,
			exports: exportsNow,
			workers: [{ id: 'in-process', host: hostname(), pid: process.pid, threads: Math.max(1, availableParallelism()), busy: exportsNow.active, jobs: 0, lastSeen: new Date().toISOString() }]
		};
	}
	let timer: ReturnType<typeof setTimeout> | undefined;
	const late = new Promise<null>((resolve) => (timer = setTimeout(() => resolve(null), timeoutMs)));
	let state: QueueState | null;
	try {
		state = await Promise.race([q.state(), late]);
	} catch {
		state = null;
	} finally {
		clearTimeout(timer);
	}
	const redis = { address: q.address, status: q.status() };
	if (!state) return { runner: 'bullmq', redis, waiting: 0, active: 0, failed: 0, exports: exportsNow, workers: [], error: `Redis at ${q.address} did not answer within ${timeoutMs / 1000} s.` };
	return { runner: 'bullmq', redis, waiting: state.waiting, active: state.active, failed: state.failed, exports: exportsNow, workers: state.workers };
}
