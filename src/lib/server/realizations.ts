/**
 * The server's realizations: regeneration and ensemble maps on a worker_threads pool (workers/node-pool.ts),
 * so long work never blocks other requests. One run at a time, in the order asked (a queue), with all cores
 * working on it. A small interface that summaries use now and exports and job runners can use later:
 * `runRealizations(recipe, list, onEach)`, `ensembleOf(hash, recipe)`, `ensembleMapOffThread(…)`.
 *
 * The realizations of the last ensemble asked for are kept in memory for a few minutes (never written), so the
 * ensemble maps of one recipe asked one after the other (mean, then SD …) regenerate it once.
 */
import { availableParallelism } from 'node:os';
import type { Recipe } from '$lib/geostat';
import type { EnsembleStat } from '$lib/ensemble';
import { createNodePool } from '$workers/node-pool';
import type { RealizationPool } from '$workers/realization-pool';

let pool: RealizationPool | null = null;
let queue: Promise<unknown> = Promise.resolve();

function thePool(): RealizationPool {
	pool ??= createNodePool({ size: Math.max(1, availableParallelism()) });
	return pool;
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
export function runRealizations(recipe: Recipe, realizations: number[], onEach?: (realization: number, values: Float64Array) => void): Promise<Map<number, Float64Array>> {
	return enqueue(() => thePool().runRecipe(recipe, realizations, { onRealization: onEach }));
}

/** An ensemble map of realizations in realization order, computed on a worker of the pool. */
export function ensembleMapOffThread(realizations: Float64Array[], stat: EnsembleStat, threshold?: number): Promise<Float64Array> {
	return enqueue(() => thePool().call((w) => w.ensembleMap(realizations, stat, threshold)));
}

/** How long the last ensemble's realizations stay in memory after their last use. */
const KEEP_MS = 5 * 60_000;
let kept: { hash: string; realizations: Float64Array[]; timer: ReturnType<typeof setTimeout> } | null = null;
const making = new Map<string, Promise<Float64Array[]>>();

/**
 * All N realizations of a recipe (N = recipe.realizations), in realization order: from memory when they were
 * made a moment ago, else regenerated on the pool (once, however many callers wait for them).
 */
export function ensembleOf(hash: string, recipe: Recipe): Promise<Float64Array[]> {
	if (kept?.hash === hash) {
		keep(hash, kept.realizations);
		return Promise.resolve(kept.realizations);
	}
	const pending = making.get(hash);
	if (pending) return pending;
	const n = recipe.realizations ?? 1;
	const list = Array.from({ length: n }, (_, r) => r);
	const job = runRealizations(recipe, list)
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
	await p?.close();
}
