/** The browser's realization pool: module Web Workers running simulation.worker.ts through comlink. */
import * as Comlink from 'comlink';
import { RealizationPool } from './realization-pool';
import type { SimulationApi } from './simulation-api';

export function createBrowserPool(size = Math.max(1, (globalThis.navigator?.hardwareConcurrency ?? 2) - 1)): RealizationPool {
	return new RealizationPool(() => {
		const worker = new Worker(new URL('./simulation.worker.ts', import.meta.url), { type: 'module' });
		return { remote: Comlink.wrap<SimulationApi>(worker), terminate: () => worker.terminate() };
	}, size);
}
