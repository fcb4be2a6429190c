// The page's handles on the workers: the realization pool (workers/browser-pool.ts) and the ensemble worker.
import * as Comlink from 'comlink';
import type { EnsembleApi } from '../../../../../workers/ensemble';
import { createBrowserPool } from '$workers/browser-pool';
import type { CheckOptions, EnsembleStat } from '$lib/ensemble';
import type { Recipe } from '$lib/geostat';
import type { RunPool } from './run.svelte';
import type { EnsembleEngine } from './viewer.svelte';

/** A pool with one worker per core (at most 8): the page's own thread only draws while they work. */
export function browserPool(): RunPool {
	return createBrowserPool(Math.max(1, Math.min(8, globalThis.navigator?.hardwareConcurrency ?? 2)));
}

export class EnsembleWorker implements EnsembleEngine {
	private readonly worker: Worker;
	private readonly api: Comlink.Remote<EnsembleApi>;

	constructor() {
		this.worker = new Worker(new URL('../../../../../workers/ensemble.ts', import.meta.url), { type: 'module', name: 'ensemble' });
		this.api = Comlink.wrap<EnsembleApi>(this.worker);
	}

	ensembleMap(realizations: Float64Array[], stat: EnsembleStat, threshold?: number): Promise<Float64Array> {
		return this.api.ensembleMap(realizations, stat, threshold);
	}

	checks(recipe: Recipe, realizations: Float64Array[], opts?: CheckOptions) {
		return this.api.checks(recipe, realizations, opts);
	}

	terminate(): void {
		this.api[Comlink.releaseProxy]();
		this.worker.terminate();
	}
}
