/// <reference path="./comlink-node-adapter.d.ts" />
/**
 * The server's realization pool: worker_threads running simulation.node-worker.ts through comlink's node
 * adapter. Under TypeScript sources (tests, the bench, the dev server) the worker loads through tsx; a
 * built server passes the URL of its bundled worker.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { RealizationPool } from './realization-pool';
import type { SimulationApi } from './simulation-api';

export interface NodePoolOptions {
	/** Number of worker threads; default the machine's available parallelism. */
	size?: number;
	/** The worker module; default simulation.node-worker.ts beside this file. */
	workerUrl?: URL;
}

export function createNodePool({ size = availableParallelism(), workerUrl = new URL('./simulation.node-worker.ts', import.meta.url) }: NodePoolOptions = {}): RealizationPool {
	const ts = workerUrl.pathname.endsWith('.ts');
	return new RealizationPool(() => {
		const worker = ts
			? new Worker(new URL('./node-worker-bootstrap.mjs', import.meta.url), { workerData: { entry: workerUrl.href } })
			: new Worker(workerUrl);
		// An idle pool must not keep the process alive.
		worker.unref();
		let stopping = false;
		const failed = new Promise<never>((_, reject) => {
			worker.once('error', (err) => reject(err instanceof Error ? err : new Error(String(err))));
			worker.once('exit', (code) => reject(new Error(stopping ? 'the simulation worker was stopped' : `the simulation worker stopped (exit ${code})`)));
		});
		failed.catch(() => undefined);
		return {
			remote: Comlink.wrap<SimulationApi>(nodeEndpoint(worker)),
			terminate: () => {
				stopping = true;
				return worker.terminate();
			},
			failed
		};
	}, size);
}
