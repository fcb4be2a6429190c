/**
 * The server's realizations: regeneration and ensemble maps on a worker_threads pool (workers/node-pool.ts),
 * so long work never blocks other requests. One run at a time, in the order asked (a queue), with all cores
 * working on it. A small interface that summaries use now and exports and job runners can use later:
 * `runRealizations(recipe, list, onEach)`, `ensembleOf(hash, recipe)`, `ensembleMapOffThread(…)`, `weakZonesOffThread(…)`.
 *
 * The workers run workers/simulation.node-worker.ts bundled by the `?server-worker` plugin (vite.config.ts), the
 * same in the built server, the dev server and vitest; a script run by tsx (the benchmarks) passes its own pool
 * to useRealizationPool instead.
 *
 * The realizations of the last ensemble asked for are kept in memory for a few minutes (never written), so the
 * ensemble maps of one recipe asked one after the other (mean, then SD …) regenerate it once.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { recipeHash, type Recipe } from '$lib/geostat';
import { CancelledError } from '$lib/cancelled-error';
import type { EnsembleStat, WeakZoneGrid, WeakZoneOptions, WeakZoneSummary } from '$lib/ensemble';
import { createNodePool } from '$workers/node-pool';
import type { RealizationPool, RunOptions } from '$workers/realization-pool';
import type { QueueRealizations } from './queue/realizations';

let pool: Promise<RealizationPool> | null = null;
let queue: Promise<unknown> = Promise.resolve();

function thePool(): Promise<RealizationPool> {
	pool ??= import('../../../workers/simulation.node-worker.ts?server-worker').then(({ default: source }) =>
		createNodePool({ size: Math.max(1, availableParallelism()), workerUrl: workerFile(source) })
	);
	return pool;
}

/**
 * The bundled worker written to a private temporary directory, removed when the process exits. Unlike the upload
 * parser's, this worker cannot start from a data: URL: its CommonJS dependencies (seedrandom, @stdlib) are bundled
 * with createRequire(import.meta.url), which needs a file URL.
 */
function workerFile(source: string): URL {
	const dir = mkdtempSync(join(tmpdir(), 'conefield-workers-'));
	const file = join(dir, 'simulation.worker.mjs');
	writeFileSync(file, source, { mode: 0o600 });
	process.once('exit', () => rmSync(dir, { recursive: true, force: true }));
	return pathToFileURL(file);
}

/** Runs on `given` instead of the bundled workers (scripts run by tsx, which has no `?server-worker`). */
export function useRealizationPool(given: RealizationPool): void {
	pool = Promise.resolve(given);
}

let queued: QueueRealizations | null = null;

/**
 * Regenerates on the realization queue (BullMQ over Redis, REDIS_URL) instead of this process's pool: what
 * runRealizations, streamRealizations and ensembleOf give is then made by the queue's workers, with the same bits.
 * Ensemble maps are still computed here, from the realizations in order. `null` goes back to the pool.
 */
export function useRealizationQueue(given: QueueRealizations | null): void {
	queued = given;
}

/** The realization queue in use, or null when realizations are made in this process. */
export function realizationQueue(): QueueRealizations | null {
	return queued;
}

/** What identifies a recipe for the queue, when the caller has it at hand (else it is computed). */
export interface RecipeIdentity {
	hash?: string;
	/** The recipe's canonical JSON, as stored, or how to read it (only the queue needs it). */
	document?: string | (() => string);
}

/** Runs `job` after every job asked for before it (whether they succeeded or not). */
function enqueue<T>(job: () => Promise<T>): Promise<T> {
	const next = queue.then(job, job);
	queue = next.catch(() => undefined);
	return next;
}

/**
 * Regenerates the given realizations of a recipe on the pool (bit for bit as regenerate() would), calling
 * `onEach` as each arrives (in completion order); resolves with all of them by number.
 * @throws (rejects) as RealizationPool.runRecipe: an invalid recipe, one of another engine version, a realization
 *   beyond the recipe's N
 */
export function runRealizations(
	recipe: Recipe,
	realizations: number[],
	onEach?: (realization: number, values: Float64Array) => void,
	identity: RecipeIdentity = {}
): Promise<Map<number, Float64Array>> {
	const q = queued;
	if (q) {
		return (async () => {
			const out = new Map<number, Float64Array>();
			for await (const [r, values] of q.stream({ recipe, ...identity }, realizations)) {
				out.set(r, values);
				onEach?.(r, values);
			}
			return out;
		})();
	}
	return enqueue(async () => (await thePool()).runRecipe(recipe, realizations, { onRealization: onEach }));
}

/**
 * Realizations of a recipe streamed in the order asked, regenerated on the pool (as runRealizations, in the same
 * queue) in batches of `ahead`: a batch runs on the pool's workers at once, and the next batch is asked for only
 * when the consumer has taken every realization of this one. So at most `ahead` realizations are made beyond those
 * taken, memory holds a batch whatever the number asked, and a consumer that reads slowly holds its own stream back
 * (backpressure) — but never the pool: between batches the pool is free for other requests, so a download that
 * stalls (a paused browser, a client that stops reading) cannot stop every other regeneration on the server. Each
 * worker keeps the recipe prepared between batches (under its hash). Stopping early (return, throw, or `signal`
 * aborting) cancels the batch running: its workers stop at once. `onProgress` reports nodes simulated over all asked.
 * @throws as runRealizations; CancelledError when `signal` aborts
 */
export async function* streamRealizations(
	recipe: Recipe,
	realizations: number[],
	{ signal, ahead = 2, onProgress, identity = {} }: { signal?: AbortSignal; ahead?: number; onProgress?: (done: number, total: number) => void; identity?: RecipeIdentity } = {}
): AsyncGenerator<[number, Float64Array]> {
	if (queued) {
		yield* queued.stream({ recipe, ...identity }, realizations, { signal, onProgress });
		return;
	}
	const size = Math.max(1, Math.floor(ahead));
	const key = realizations.length > size ? (identity.hash ?? recipeHash(recipe)) : undefined;
	for (let from = 0; from < realizations.length; from += size) {
		if (signal?.aborted) throw new CancelledError();
		const batch = realizations.slice(from, from + size);
		const progress = onProgress
			? (done: number, total: number) => {
					// The pool reports this batch's nodes: per realization, total / batch length.
					const per = total / batch.length;
					onProgress(from * per + done, realizations.length * per);
				}
			: undefined;
		const made = await runRealizationsWith(recipe, batch, { keep: true, signal, key, onProgress: progress });
		for (const r of batch) {
			const values = made.get(r);
			if (!values) throw new Error(`realization ${r} did not arrive`);
			made.delete(r);
			yield [r, values];
		}
	}
}

/** runRealizations with every option of the pool's run (keeping, abort, progress, key). */
function runRealizationsWith(recipe: Recipe, realizations: number[], opts: RunOptions): Promise<Map<number, Float64Array>> {
	return enqueue(async () => {
		if (opts.signal?.aborted) throw new CancelledError();
		return (await thePool()).runRecipe(recipe, realizations, opts);
	});
}

/** An ensemble map of realizations in realization order, computed on a worker of the pool. */
export function ensembleMapOffThread(realizations: Float64Array[], stat: EnsembleStat, threshold?: number): Promise<Float64Array> {
	return enqueue(async () => (await thePool()).call((w) => w.ensembleMap(realizations, stat, threshold)));
}

/** Weak-zone continuity of realizations in realization order, computed on a worker of the pool. */
export function weakZonesOffThread(realizations: Float64Array[], grid: WeakZoneGrid, opts: WeakZoneOptions): Promise<WeakZoneSummary> {
	return enqueue(async () => (await thePool()).call((w) => w.weakZones(realizations, grid, opts)));
}

/** How long the last ensemble's realizations stay in memory after their last use. */
const KEEP_MS = 5 * 60_000;
let kept: { hash: string; realizations: Float64Array[]; timer: ReturnType<typeof setTimeout> } | null = null;
const making = new Map<string, Promise<Float64Array[]>>();

/**
 * All N realizations of a recipe (N = recipe.realizations), in realization order: from memory when they were
 * made a moment ago, else regenerated on the pool (once, however many callers wait for them).
 */
export function ensembleOf(hash: string, recipe: Recipe, document?: string): Promise<Float64Array[]> {
	if (kept?.hash === hash) {
		keep(hash, kept.realizations);
		return Promise.resolve(kept.realizations);
	}
	const pending = making.get(hash);
	if (pending) return pending;
	const n = recipe.realizations ?? 1;
	const list = Array.from({ length: n }, (_, r) => r);
	const job = runRealizations(recipe, list, undefined, { hash, document })
		.then((byNumber) => {
			const ordered = list.map((r) => byNumber.get(r)!);
			keep(hash, ordered);
			return ordered;
		})
		.finally(() => making.delete(hash));
	making.set(hash, job);
	return job;
}

/** Realization r of a kept ensemble, if that ensemble is in memory. */
export function keptRealization(hash: string, realization: number): Float64Array | undefined {
	return kept?.hash === hash ? kept.realizations[realization] : undefined;
}

function keep(hash: string, realizations: Float64Array[]): void {
	if (kept) clearTimeout(kept.timer);
	const timer = setTimeout(() => (kept = null), KEEP_MS);
	timer.unref();
	kept = { hash, realizations, timer };
}

/** Stops the pool's workers and forgets the kept ensemble (tests, shutdown). */
export async function stopRealizations(): Promise<void> {
	if (kept) clearTimeout(kept.timer);
	kept = null;
	const p = pool;
	pool = null;
	await (await p)?.close();
}
