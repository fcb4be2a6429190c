import { CancelledError } from '$lib/cancelled-error';
import type { Recipe } from '$lib/geostat';

/** What the run needs of a realization pool (workers/realization-pool.ts), so tests can pass one in process. */
export interface RunPool {
	runRecipe(
		recipe: Recipe,
		realizations: number[],
		opts: { onProgress?: (done: number, total: number) => void; onRealization?: (r: number, values: Float64Array) => void }
	): Promise<Map<number, Float64Array>>;
	/** Starts the workers and compiles the engine in them ahead of a run (RealizationPool.warm). */
	warm?(): Promise<void>;
	cancel(): void;
	close(): Promise<void>;
}

export type RunStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'failed';

/**
 * Progress reaches the page at most this often (and always at the end). Each worker reports a hundred times a
 * realization, and every update re-rendered the run bar: in Chromium's trace of the demo's 20 realizations on a
 * 2-core machine the page's own frames kept its main thread busy 5 s of a 13 s run, time taken from the workers.
 */
export const PROGRESS_INTERVAL_MS = 250;

/** Time left goes by the rate over about this much of the latest progress (see EnsembleRun.left). */
export const RATE_WINDOW_MS = 2000;

interface Sample {
	fraction: number;
	elapsed: number;
}

/**
 * The realizations of one recipe made in the browser's worker pool and kept in memory only (never written):
 * overall progress, time left, cancel. Realizations arrive in completion order; each is shown as soon as it
 * arrives. Running again continues with the realizations not made yet.
 */
export class EnsembleRun {
	status = $state<RunStatus>('idle');
	/** Simulated nodes done and to do over the realizations of the current run. */
	done = $state(0);
	total = $state(0);
	message = $state('');
	/** Bumped whenever a realization arrives, so views depending on `results` update. */
	version = $state(0);
	/** Milliseconds since the run started, refreshed with the progress. */
	elapsed = $state(0);
	/** Milliseconds from Run to the first realization, and to the last, of the latest run. */
	firstAt = $state<number | null>(null);
	lastAt = $state<number | null>(null);

	readonly results = new Map<number, Float64Array>();
	readonly fraction = $derived(this.total > 0 ? this.done / this.total : 0);
	/**
	 * Where the rate of time left is measured from: the progress on show about RATE_WINDOW_MS ago, but never before
	 * the first realization arrived. Each worker's first realization is slower than the rest (the engine is compiled,
	 * every target's data searched): timed from the start, the demo's run said "about 25 s left" at 10 % and ended
	 * 5 s later.
	 */
	private rateFrom = $state.raw<Sample | null>(null);
	/** Progress shown since the first realization arrived, oldest first, trimmed to the window (rateFrom is the first). */
	private samples: Sample[] = [];
	/**
	 * Estimated milliseconds left at the recent rate (see rateFrom), or before the first realization arrives at the
	 * rate since the start once a few per cent are done; null while there is nothing to go by.
	 */
	readonly left = $derived.by(() => {
		if (this.status !== 'running') return null;
		const f = this.fraction;
		const b = this.rateFrom;
		if (b !== null && f > b.fraction) return ((this.elapsed - b.elapsed) * (1 - f)) / (f - b.fraction);
		return f > 0.02 ? (this.elapsed * (1 - f)) / f : null;
	});
	readonly count = $derived.by(() => {
		void this.version;
		return this.results.size;
	});

	private pool: RunPool | null = null;
	private started = 0;
	/** When progress was last shown (see PROGRESS_INTERVAL_MS). */
	private shownAt = -Infinity;

	constructor(
		readonly recipe: Recipe,
		private readonly startPool: () => RunPool,
		private readonly now: () => number = () => performance.now()
	) {}

	/** Adds the progress on show to the samples, drops those older than the window, and moves rateFrom. */
	private keepSample(): void {
		const { samples } = this;
		samples.push({ fraction: this.fraction, elapsed: this.elapsed });
		while (samples.length > 1 && samples[1].elapsed <= this.elapsed - RATE_WINDOW_MS) samples.shift();
		if (this.rateFrom !== samples[0]) this.rateFrom = samples[0];
	}

	/** N, the recipe's number of realizations. */
	get n(): number {
		return this.recipe.realizations ?? 1;
	}

	/** Makes the realizations not made yet (all of 0 … N − 1 by default); resolves when they are in or the run stops. */
	async run(list: number[] = Array.from({ length: this.n }, (_, r) => r)): Promise<void> {
		if (this.status === 'running') return;
		const todo = list.filter((r) => !this.results.has(r));
		if (todo.length === 0) {
			this.status = 'done';
			return;
		}
		this.pool ??= this.startPool();
		this.status = 'running';
		this.message = '';
		this.done = 0;
		this.total = 0;
		this.firstAt = null;
		this.lastAt = null;
		this.started = this.now();
		this.shownAt = -Infinity;
		this.rateFrom = null;
		this.samples = [];
		this.elapsed = 0;
		try {
			await this.pool.runRecipe(this.recipe, todo, {
				onProgress: (done, total) => {
					const now = this.now();
					if (done < total && now - this.shownAt < PROGRESS_INTERVAL_MS) return;
					this.shownAt = now;
					this.done = done;
					this.total = total;
					this.elapsed = now - this.started;
					if (this.samples.length > 0) this.keepSample();
				},
				onRealization: (r, values) => {
					this.results.set(r, values);
					if (this.firstAt === null) {
						this.firstAt = this.now() - this.started;
						this.keepSample();
					}
					this.version++;
				}
			});
			this.lastAt = this.now() - this.started;
			this.status = 'done';
		} catch (err) {
			if (CancelledError.revive(err) instanceof CancelledError) {
				this.status = 'cancelled';
				this.message = `Cancelled: ${this.results.size} of ${this.n} realizations are kept.`;
			} else {
				this.status = 'failed';
				this.message = (err as Error).message;
			}
		}
	}

	/**
	 * Readies the pool ahead of a run: its workers start and compile the engine on a small section, so Run finds
	 * them ready. Measured on the demo's recipe in Chromium, two workers: the second realization of each 0.3 s instead
	 * of 0.6–0.75 s, the whole run 0.5 s shorter even with the warm-up counted.
	 */
	warm(): void {
		if (this.status === 'running' || this.count === this.n) return;
		this.pool ??= this.startPool();
		void this.pool.warm?.();
	}

	cancel(): void {
		this.pool?.cancel();
	}

	/** The realizations in realization order when all N are in, else null. */
	all(): Float64Array[] | null {
		if (this.results.size < this.n) return null;
		return Array.from({ length: this.n }, (_, r) => this.results.get(r)!);
	}

	async destroy(): Promise<void> {
		this.pool?.cancel();
		await this.pool?.close();
		this.pool = null;
	}
}
