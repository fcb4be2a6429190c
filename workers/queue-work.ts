/**
 * What a queue worker does with a range job (workers/queue-worker.ts starts it): fetch the recipe by its hash from
 * Redis (checked against the hash, parsed once and kept for the next jobs), regenerate the range's realizations on
 * one of its simulation threads (a RealizationPool of one thread per slot, so a slot keeps its recipe prepared
 * between jobs), and write each realization whole under its own key as it is made. Before each write, and every
 * second while a realization is being made, it checks that the run is still wanted; a run that has ended (cancelled,
 * finished, or the server gone) stops the work and nothing more is written.
 */
import type { Job } from 'bullmq';
import type { Redis } from 'ioredis';
import { CancelledError } from '../src/lib/cancelled-error';
import { sha256 } from '../src/lib/geostat/recipe/sha256';
import { recipeSchema, type Recipe } from '../src/lib/geostat/recipe/schema';
import { TTL, keys, valuesToBuffer, type RangeJobData, type RangeJobResult, type RangeProgress } from '../src/lib/server/queue/protocol';
import type { RealizationPool } from './realization-pool';

/** Recipes kept parsed, by hash (a worker usually serves one or two at a time). */
const KEEP_RECIPES = 4;

export interface RangeWorkerOptions {
	redis: Redis;
	/** One single-thread pool per slot; as many slots as jobs the worker takes at once. */
	slots: RealizationPool[];
	/** The worker's name, in results and logs. */
	name: string;
	/** How often a running range checks that its run is still wanted (default 1 s). */
	checkMs?: number;
	log?: (line: string) => void;
}

/** The BullMQ processor of range jobs, with the worker's counters. */
export function rangeProcessor({ redis, slots, name, checkMs = 1000, log = () => undefined }: RangeWorkerOptions) {
	const free = slots.slice();
	const recipes = new Map<string, Recipe>();
	const stats = { jobs: 0, busy: 0 };

	async function recipeOf(hash: string): Promise<Recipe> {
		const kept = recipes.get(hash);
		if (kept) {
			recipes.delete(hash);
			recipes.set(hash, kept);
			return kept;
		}
		const text = await redis.get(keys.recipe(hash));
		if (text === null) throw new Error(`recipe ${hash.slice(0, 12)}… is not in Redis (expired, or Redis restarted)`);
		if (sha256(text) !== hash) throw new Error(`the recipe stored under ${hash.slice(0, 12)}… does not have that hash`);
		const recipe = recipeSchema.parse(JSON.parse(text)) as Recipe;
		recipes.set(hash, recipe);
		if (recipes.size > KEEP_RECIPES) recipes.delete(recipes.keys().next().value!);
		return recipe;
	}

	const wanted = async (run: string) => (await redis.exists(keys.run(run))) === 1;

	async function process(job: Job<RangeJobData, RangeJobResult>): Promise<RangeJobResult> {
		const { run, hash, realizations } = job.data;
		const skipped: RangeJobResult = { written: 0, prepareMs: 0, realizeMs: 0, skipped: 'run-ended', worker: name };
		if (!(await wanted(run))) return skipped;
		const recipe = await recipeOf(hash);
		const pool = free.pop();
		if (!pool) throw new Error('no free simulation thread (more jobs taken than slots)');
		stats.busy++;
		const stop = new AbortController();
		const checker = setInterval(() => {
			wanted(run).then(
				(yes) => yes || stop.abort(),
				() => undefined
			);
		}, checkMs);
		const started = performance.now();
		let firstAt = 0;
		let written = 0;
		let writes = Promise.resolve();
		let lastProgress = 0;
		log(`range ${realizations[0]}–${realizations.at(-1)} of ${hash.slice(0, 12)}… (job ${job.id}, attempt ${job.attemptsMade + 1})`);
		try {
			let current = realizations[0];
			await pool.runRecipe(recipe, realizations, {
				key: hash,
				keep: false,
				signal: stop.signal,
				onProgress: (done, total) => {
					if (firstAt === 0 && done > 0) firstAt = performance.now();
					const now = Date.now();
					if (now - lastProgress < 500) return;
					lastProgress = now;
					const per = total / realizations.length;
					const progress: RangeProgress = { r: current, fraction: Math.max(0, Math.min(0.99, (done - written * per) / per)) };
					void job.updateProgress(progress).catch(() => undefined);
				},
				onRealization: (r, values) => {
					// Writes go one after the other, each whole; the next realization is already being made meanwhile.
					writes = writes.then(async () => {
						if (!(await wanted(run))) {
							stop.abort();
							return;
						}
						await redis.set(keys.result(run, r), valuesToBuffer(values), 'EX', TTL.result);
						written++;
						const progress: RangeProgress = { r, fraction: 1 };
						await job.updateProgress(progress).catch(() => undefined);
					});
					const next = realizations.indexOf(r) + 1;
					if (next < realizations.length) current = realizations[next];
				}
			});
			await writes;
			if (stop.signal.aborted) return { ...skipped, written };
			stats.jobs++;
			const total = performance.now() - started;
			const prepareMs = firstAt ? Math.max(0, firstAt - started) : 0;
			return { written, prepareMs: Math.round(prepareMs), realizeMs: Math.round(total - prepareMs), worker: name };
		} catch (err) {
			await writes.catch(() => undefined);
			if (err instanceof CancelledError && stop.signal.aborted) return { ...skipped, written };
			throw err;
		} finally {
			clearInterval(checker);
			stats.busy--;
			free.push(pool);
		}
	}

	return { process, stats };
}
