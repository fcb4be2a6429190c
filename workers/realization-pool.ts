/**
 * A pool of simulation workers that runs N realizations on all cores, with overall progress and cancel.
 * Environment-neutral: the browser (browser-pool.ts) and Node.js (node-pool.ts) only supply the way to
 * start a worker. Each worker prepares the simulation once per run and then takes realizations from a
 * shared queue; results come back keyed by realization number, so their order and the number of workers
 * never change a bit of any realization (each depends only on the recipe and its number).
 */
import * as Comlink from 'comlink';
import type { Remote } from 'comlink';
import type { SimulationApi } from './simulation-api';
import type { Recipe, SimulationInput, TargetPoints } from '../src/lib/geostat/index';
import { CancelledError } from '../src/lib/cancelled-error';

/** A started worker: its comlink proxy and how to stop it. */
export interface PoolWorker {
	remote: Remote<SimulationApi>;
	terminate(): void | Promise<unknown>;
	/** Rejects if the worker dies or cannot load (so a run does not wait for it forever). */
	failed?: Promise<never>;
}

/** Options of RealizationPool.run. */
export interface RunOptions {
	/** Overall progress: simulated nodes over all requested realizations. */
	onProgress?: (done: number, total: number) => void;
	/** Called as each realization arrives (in completion order), e.g. to stream an export. */
	onRealization?: (realization: number, values: Float64Array) => void;
	/** Aborting cancels the run like cancel(). */
	signal?: AbortSignal;
	/** Keep the realizations in the map the run resolves with (default true); false when onRealization takes them. */
	keep?: boolean;
	/**
	 * runRecipe only: the recipe's hash. A worker that prepared the recipe under this key before (and has not been
	 * restarted since) keeps its prepared simulation instead of preparing it again, so a worker serving one recipe
	 * over many small runs (the queue's realization ranges) prepares it once. Same bits either way.
	 */
	key?: string;
}

export class RealizationPool {
	private workers: PoolWorker[] = [];
	private cancelRun: (() => void) | null = null;

	/**
	 * @param spawn starts one worker
	 * @param size number of workers (default 1); a run never starts more workers than realizations
	 * @throws {RangeError} if size is not a positive integer
	 */
	constructor(
		private readonly spawn: () => PoolWorker,
		readonly size = 1
	) {
		if (!Number.isInteger(size) || size < 1) throw new RangeError('pool size must be a positive integer');
	}

	/**
	 * Runs the given realizations of a simulation; resolves with a map from realization number to values.
	 * One run at a time.
	 * @throws {CancelledError} (rejects) when cancelled or aborted
	 * @throws {Error} (rejects) if a run is already in progress, or with a worker's error
	 */
	run(input: SimulationInput, targets: TargetPoints, realizations: number[], opts: RunOptions = {}): Promise<Map<number, Float64Array>> {
		return this.execute((w) => w.remote.prepare(input, targets), realizations, opts);
	}

	/**
	 * Runs realizations of a recipe, as regenerate() would one by one (same bits); only the recipe is sent
	 * to the workers. Rejects like run(), and with the worker's error for an invalid or outdated recipe.
	 */
	runRecipe(recipe: Recipe, realizations: number[], opts: RunOptions = {}): Promise<Map<number, Float64Array>> {
		const key = opts.key;
		if (key === undefined) {
			// A worker that makes one realization of this preparation keeps nothing per target for the next (it pays
			// off from the second on): a mesh of a million elements then needs some 30 MB less while it runs.
			const once = realizations.length <= this.size;
			return this.execute((w) => w.remote.prepareRecipe(recipe, undefined, once ? { keepPerTarget: false } : undefined), realizations, opts);
		}
		return this.execute(
			async (w) => {
				const active = await w.remote.preparedAs(key);
				return active >= 0 ? active : w.remote.prepareRecipe(recipe, key);
			},
			realizations,
			opts
		);
	}

	private async execute(
		prepare: (w: PoolWorker) => Promise<number>,
		realizations: number[],
		opts: RunOptions
	): Promise<Map<number, Float64Array>> {
		if (this.cancelRun) throw new Error('a run is already in progress');
		for (const r of realizations) if (!Number.isSafeInteger(r) || r < 0) throw new RangeError('realizations must be integers >= 0');
		const results = new Map<number, Float64Array>();
		if (realizations.length === 0) return results;
		const { onProgress, onRealization, signal, keep = true } = opts;
		const done = new Set<number>();
		if (signal?.aborted) throw new CancelledError();
		const n = Math.min(this.size, realizations.length);
		while (this.workers.length < n) this.workers.push(this.spawn());
		const queue = realizations.slice();
		let perRealization = 0;
		const partial = new Map<number, number>();
		let completedNodes = 0;
		const report = () => {
			if (!onProgress || perRealization === 0) return;
			let sum = completedNodes;
			for (const v of partial.values()) sum += v;
			onProgress(sum, perRealization * realizations.length);
		};

		let cancelled = false;
		const cancelPromise = new Promise<never>((_, reject) => {
			this.cancelRun = () => {
				cancelled = true;
				reject(new CancelledError());
			};
		});
		const onAbort = () => this.cancel();
		signal?.addEventListener('abort', onAbort);

		const work = async (w: PoolWorker) => {
			perRealization = await prepare(w);
			for (let r = queue.shift(); r !== undefined && !cancelled; r = queue.shift()) {
				const rr = r;
				const progress = onProgress
					? Comlink.proxy((nodes: number) => {
							// Progress travels on its own port and may arrive after the result, or after a cancel.
							if (cancelled || done.has(rr)) return;
							partial.set(rr, nodes);
							report();
						})
					: undefined;
				const values = await w.remote.realize(rr, progress);
				if (cancelled) return;
				partial.delete(rr);
				completedNodes += perRealization;
				done.add(rr);
				if (keep) results.set(rr, values);
				report();
				onRealization?.(rr, values);
			}
		};
		const running = this.workers.slice(0, n);
		const died = running.flatMap((w) => (w.failed ? [w.failed] : []));
		try {
			await Promise.race([Promise.all(running.map(work)), cancelPromise, ...died]);
			return results;
		} catch (err) {
			if (!(err instanceof CancelledError)) {
				// A worker died (or threw): start afresh next time rather than reuse a pool in an unknown state.
				cancelled = true;
				for (const w of this.workers) void w.terminate();
				this.workers = [];
			}
			throw err;
		} finally {
			signal?.removeEventListener('abort', onAbort);
			this.cancelRun = null;
			// Swallow the pending rejection of a promise that lost the race.
			cancelPromise.catch(() => undefined);
		}
	}

	/**
	 * Starts the pool's workers, if none are running, and has each compile the engine on a small section
	 * (SimulationApi.warm) while nothing is asked of it: a run started afterwards finds them ready. Never waits for
	 * a run, never changes a bit; a run started while they warm up queues behind it in each worker. Resolves when all
	 * have warmed up (a worker that fails to is left for the next run to find), or at once when workers were running.
	 */
	async warm(): Promise<void> {
		if (this.workers.length > 0 || this.cancelRun) return;
		while (this.workers.length < this.size) this.workers.push(this.spawn());
		await Promise.all(this.workers.map((w) => w.remote.warm().catch(() => undefined)));
	}

	/**
	 * One call on a worker of the pool between runs (starting a worker when none is running), e.g. an ensemble
	 * map of realizations already made.
	 * @throws {Error} (rejects) if a run is in progress, or with the worker's error
	 */
	async call<T>(fn: (remote: Remote<SimulationApi>) => Promise<T>): Promise<T> {
		if (this.cancelRun) throw new Error('a run is already in progress');
		if (this.workers.length === 0) this.workers.push(this.spawn());
		return fn(this.workers[0].remote);
	}

	/**
	 * Cancels the run in progress: its workers are terminated at once (a realization is one synchronous
	 * computation, so stopping the thread is the only prompt way) and restarted on the next run.
	 */
	cancel(): void {
		const stop = this.cancelRun;
		if (!stop) return;
		for (const w of this.workers) void w.terminate();
		this.workers = [];
		stop();
	}

	/** Stops all workers; the pool may still be used afterwards (workers restart on demand). */
	async close(): Promise<void> {
		this.cancel();
		const ws = this.workers;
		this.workers = [];
		await Promise.all(ws.map((w) => w.terminate()));
	}
}
