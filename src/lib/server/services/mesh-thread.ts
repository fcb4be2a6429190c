/// <reference path="../../../../workers/comlink-node-adapter.d.ts" />
/**
 * One worker thread that reads mesh uploads (mesh.worker.ts through comlink's node adapter), started on first use
 * and kept, idle, without holding the process open; bundled and started as the import's worker is (import-thread.ts).
 * Should the worker fail to load, reading falls back to the calling thread, with a warning.
 */
import { Worker } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { readMeshUpload, type MeshReadRequest, type MeshReadResult } from './mesh-read';
import type { MeshWorkerApi } from './mesh.worker';

let running: Promise<{ worker: Worker; remote: Comlink.Remote<MeshWorkerApi>; died: Promise<never> }> | undefined;
let unavailable = false;

// The worker's source is imported on first use: scripts run by tsx (the benchmarks) load the services without the
// `?server-worker` plugin and never read a mesh.
async function start() {
	const { default: workerSource } = await import('./mesh.worker.ts?server-worker');
	const worker = new Worker(new URL(`data:text/javascript,${encodeURIComponent(workerSource)}`));
	worker.unref();
	const died = new Promise<never>((_, reject) => {
		const fail = (err: unknown) => {
			void running?.then((r) => {
				if (r.worker === worker) running = undefined;
			});
			reject(err instanceof Error ? err : new Error(`the mesh worker stopped (exit ${String(err)})`));
		};
		worker.once('error', fail);
		worker.once('exit', fail);
	});
	died.catch(() => {});
	return { worker, remote: Comlink.wrap<MeshWorkerApi>(nodeEndpoint(worker)), died };
}

/** readMeshUpload in the worker thread; the same result as in this thread. The bytes are transferred. */
export async function readMeshOffThread(request: MeshReadRequest): Promise<MeshReadResult> {
	if (unavailable) return readMeshUpload(request);
	try {
		running ??= start();
		const { remote, died } = await running;
		const bytes = request.bytes.byteOffset === 0 && request.bytes.byteLength === request.bytes.buffer.byteLength ? request.bytes : request.bytes.slice();
		return await Promise.race([remote.read(Comlink.transfer({ ...request, bytes }, [bytes.buffer as ArrayBuffer])), died]);
	} catch (err) {
		const code = (err as { code?: unknown } | null)?.code;
		if (code === 'ERR_MODULE_NOT_FOUND' || code === 'ERR_WORKER_PATH' || code === 'ERR_UNKNOWN_FILE_EXTENSION') {
			running = undefined;
			unavailable = true;
			console.warn('[meshes] the mesh worker could not run; reading on the request thread instead:', err instanceof Error ? err.message : err);
			return readMeshUpload(request);
		}
		throw err;
	}
}

/** Stops the worker (tests, shutdown). */
export async function stopMeshWorker(): Promise<void> {
	const r = running;
	running = undefined;
	await (await r)?.worker.terminate();
}
