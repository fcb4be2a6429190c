/// <reference path="../../../../workers/comlink-node-adapter.d.ts" />
/**
 * One worker thread that parses uploads (import.worker.ts through comlink's node adapter), started on first
 * use and kept, idle, without holding the process open. The worker's code comes bundled as a string
 * (vite.config.ts, `?server-worker`) and starts from a data: URL, the same way in the built server, the dev
 * server and the tests. Should the worker fail to load, parsing falls back to the calling thread, with a warning.
 */
import { Worker } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { parseUpload, type ParseRequest, type ParsedUpload } from './import-parse';
import type { ImportWorkerApi } from './import.worker';
import workerSource from './import.worker.ts?server-worker';

interface Running {
	worker: Worker;
	remote: Comlink.Remote<ImportWorkerApi>;
	/** Rejects when the worker dies, so a call in progress does not wait forever. */
	died: Promise<never>;
}

let running: Running | undefined;
let unavailable = false;

function start(): Running {
	const worker = new Worker(new URL(`data:text/javascript,${encodeURIComponent(workerSource)}`));
	worker.unref();
	const died = new Promise<never>((_, reject) => {
		const fail = (err: unknown) => {
			if (running?.worker === worker) running = undefined;
			reject(err instanceof Error ? err : new Error(`the import worker stopped (exit ${String(err)})`));
		};
		worker.once('error', fail);
		worker.once('exit', fail);
	});
	died.catch(() => {});
	return { worker, remote: Comlink.wrap<ImportWorkerApi>(nodeEndpoint(worker)), died };
}

/** `parseUpload` in the worker thread; the same result as in this thread. */
export async function parseUploadOffThread(request: ParseRequest): Promise<ParsedUpload> {
	if (unavailable) return parseUpload(request);
	try {
		running ??= start();
		const { remote, died } = running;
		return await Promise.race([remote.parse(request), died]);
	} catch (err) {
		// Only a worker that cannot load at all (a missing file) is worked around; one that died on an upload
		// (out of memory, say) must not take the server's own thread down with the same input.
		if (isLoadFailure(err)) {
			unavailable = true;
			console.warn('[import] the import worker could not run; parsing on the request thread instead:', err instanceof Error ? err.message : err);
			return parseUpload(request);
		}
		throw err;
	}
}

function isLoadFailure(err: unknown): boolean {
	const code = (err as { code?: unknown } | null)?.code;
	return typeof code === 'string' && (code === 'ERR_MODULE_NOT_FOUND' || code === 'ERR_WORKER_PATH' || code === 'ERR_UNKNOWN_FILE_EXTENSION');
}

/** Stops the worker (tests, shutdown). */
export async function stopImportWorker(): Promise<void> {
	const r = running;
	running = undefined;
	await r?.worker.terminate();
}
