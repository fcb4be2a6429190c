// Loads a TypeScript worker entry through tsx inside a worker thread: Node 20 applies `--import tsx` from a
// Worker's execArgv too late for the thread's entry module, so the hooks are registered here first.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
