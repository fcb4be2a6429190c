/// <reference path="./comlink-node-adapter.d.ts" />
/** worker_threads entry exposing the simulation engine through comlink's node adapter (see simulation-api.ts). */
import { parentPort } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { createSimulationApi } from './simulation-api';

if (!parentPort) throw new Error('simulation.node-worker must run in a worker thread');
Comlink.expose(createSimulationApi(), nodeEndpoint(parentPort));
