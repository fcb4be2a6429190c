/**
 * What a domain's walk along a constant path (search.path 'random-constant' or 'multigrid-constant') solved at each
 * step, kept for the next realizations: on a path that is the same in every realization, the nodes simulated before
 * a step, and so its neighbourhood, its kriging system, weights and variance, are the same in every realization
 * too; only the values differ (Nussbaumer, Mariethoz, Gravey, Gloaguen & Holliger 2018, Accelerating sequential
 * Gaussian simulation with a constant path, Computers & Geosciences 112 (memory)). A later realization then takes
 * each step's estimate as the same sum of the same weights times the same neighbours' values, in the same order,
 * and √variance: the very bits a fresh solve gives.
 *
 * Layout: per step, the standard deviation √σ²_K and where its entries start; per entry, its weight and a
 * reference to its value: i ≥ 0 a target's simulated value y[i], −1 − i the domain's datum i. Steps are recorded
 * in path order (the first `recorded` are kept) up to `steps`, which the memory given fixes; the arrays are sized
 * for kmax entries a step but memory is only touched as entries are written.
 */
export class PathPlan {
	/** Steps the plan can hold (the domain's whole path when the memory allows it). */
	readonly steps: number;
	readonly kmax: number;
	/** Steps recorded so far: steps 0 … recorded − 1 of the path can be replayed. */
	recorded = 0;
	/** The constant path itself (positions in the domain's pathNodes), drawn once. */
	path: Int32Array | null = null;
	readonly sd: Float64Array;
	readonly start: Int32Array;
	readonly ref: Int32Array;
	readonly w: Float64Array;

	/** Bytes a step with up to kmax entries reserves (its standard deviation, its start, kmax weights and references). */
	static bytesPerStep(kmax: number): number {
		return 12 + 12 * kmax;
	}

	/** Bytes a plan of `steps` steps with up to kmax entries each reserves. */
	static bytes(steps: number, kmax: number): number {
		return steps * PathPlan.bytesPerStep(kmax) + 4;
	}

	/** @throws {RangeError} if steps or kmax is not an integer ≥ 0 */
	constructor(steps: number, kmax: number) {
		if (!Number.isInteger(steps) || steps < 0) throw new RangeError('steps must be an integer >= 0');
		if (!Number.isInteger(kmax) || kmax < 0) throw new RangeError('kmax must be an integer >= 0');
		this.steps = steps;
		this.kmax = kmax;
		this.sd = new Float64Array(steps);
		this.start = new Int32Array(steps + 1);
		this.ref = new Int32Array(steps * kmax);
		this.w = new Float64Array(steps * kmax);
	}

	/** Whether step `step` is the next one to record and there is room for it. */
	wants(step: number): boolean {
		return step === this.recorded && step < this.steps;
	}

	/**
	 * Records the next step: its k entries' references (ref[0 … k)) and weights (w[at … at + k)), and its standard
	 * deviation.
	 * @throws {RangeError} if k exceeds kmax or the plan is full
	 */
	push(k: number, ref: Int32Array, w: Float64Array, at: number, sd: number): void {
		const s = this.recorded;
		if (s >= this.steps) throw new RangeError('the plan is full');
		if (k > this.kmax) throw new RangeError('more entries than kmax');
		const o = this.start[s];
		for (let p = 0; p < k; p++) {
			this.ref[o + p] = ref[p];
			this.w[o + p] = w[at + p];
		}
		this.sd[s] = sd;
		this.start[s + 1] = o + k;
		this.recorded = s + 1;
	}
}
