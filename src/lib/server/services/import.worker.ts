/// <reference path="../../../../workers/comlink-node-adapter.d.ts" />
/** worker_threads entry: parses uploads off the request thread (see import-thread.ts). Relative imports only. */
import { parentPort } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { parseUpload, type ParseRequest, type ParsedUpload } from './import-parse';

if (!parentPort) throw new Error('import.worker must run in a worker thread');

/** The parsed columns' buffers travel back without a copy. */
function transferables(result: ParsedUpload): ArrayBuffer[] {
	const buffers = new Set<ArrayBuffer>();
	for (const file of result.parsed) {
		for (const s of file.soundings) {
			for (const column of [s.depth, s.qc, s.fs, s.u2, ...Object.values(s.extra ?? {})]) {
				if (column && column.buffer instanceof ArrayBuffer) buffers.add(column.buffer);
			}
		}
	}
	return [...buffers];
}

const api = {
	parse(request: ParseRequest): ParsedUpload {
		const result = parseUpload(request);
		return Comlink.transfer(result, transferables(result));
	}
};
export type ImportWorkerApi = typeof api;

Comlink.expose(api, nodeEndpoint(parentPort));
