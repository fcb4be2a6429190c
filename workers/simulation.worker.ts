/** Module Web Worker exposing the simulation engine through comlink (see simulation-api.ts). */
import * as Comlink from 'comlink';
import { createSimulationApi } from './simulation-api';

Comlink.expose(createSimulationApi());
