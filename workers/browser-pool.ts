/** The browser's realization pool: module Web Workers running simulation.worker.ts through comlink. */
import * as Comlink from 'comlink';
import { RealizationPool } from './realization-pool';
import type { SimulationApi } from './simulation-api';

export function createBrowserPool(size = Math.max(1, (globalThis.navigator?.hardwareConcurrency ?? 2) - 1)): RealizationPool {
	return new RealizationPool(() => {
		const worker = new Worker(new URL('./simulation.worker.ts', import.meta.url), { type: 'module' });
		const failed = new Promise<never>((_, reject) => {
			worker.addEventListener('error', (e) => reject(new Error(e.message || 'the simulation worker failed to load')));
		});
		failed.catch(() => undefined);
		return { remote: Comlink.wrap<SimulationApi>(worker), terminate: () => worker.terminate(), failed };
	}, size);
}
