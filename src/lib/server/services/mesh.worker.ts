/// <reference path="../../../../workers/comlink-node-adapter.d.ts" />
/** worker_threads entry: reads mesh files off the request thread (see mesh-thread.ts). Relative imports only. */
import { parentPort } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { readMeshUpload, type MeshReadRequest, type MeshReadResult } from './mesh-read';

if (!parentPort) throw new Error('mesh.worker must run in a worker thread');

const api = {
	read(request: MeshReadRequest): MeshReadResult {
		const result = readMeshUpload(request);
		if (!result.ok) return result;
		const { x, y, z, groupIndex } = result.mesh;
		return Comlink.transfer(result, [x.buffer, z.buffer, ...(y ? [y.buffer] : []), ...(groupIndex ? [groupIndex.buffer] : [])] as ArrayBuffer[]);
	}
};
export type MeshWorkerApi = typeof api;

Comlink.expose(api, nodeEndpoint(parentPort));
