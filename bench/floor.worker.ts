// The floor of the simulation benchmarks, measured in a worker thread of its own: copying, factoring and solving
// k×k covariance matrices with the engine's Cholesky (choleskyFactor, choleskySolve) and nothing else. In the
// simulating thread the same loop measured 5.8 to 16 µs a system at k = 31, depending on the type feedback the
// engine's own calls had left on choleskyFactor; here the isolate holds nothing but this loop. It answers each
// message { systems } with the microseconds a system of one pass (wall time: the thread does nothing else, and the
// simulating thread waits), after three untimed passes at start, so the compiler's work is not the floor.
import { parentPort, workerData } from 'node:worker_threads';
import { choleskyFactor, choleskySolve, covariance } from '../src/lib/geostat/index';
import type { VariogramModel } from '../src/lib/geostat/index';

/** workerData of this worker. */
export interface FloorOptions {
	k: number;
}

/** Covariance matrices of k points along a line: SPD with realistic conditioning. */
function floorMatrices(k: number): Float64Array[] {
	const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 1 }] };
	return Array.from({ length: 64 }, (_, s) => {
		const a = new Float64Array(k * k);
		for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) a[i * k + j] = covariance(model, (i - j) * (1 + s / 64) * 2.3, 0, 0);
		return a;
	});
}

/** Microseconds a system over one pass of `systems` systems. */
function pass(mats: Float64Array[], k: number, systems: number): number {
	const a = new Float64Array(k * k);
	const b = new Float64Array(k).fill(0.5);
	const x = new Float64Array(k);
	let sink = 0;
	const t0 = performance.now();
	for (let s = 0; s < systems; s++) {
		a.set(mats[s % mats.length]);
		if (!choleskyFactor(a, k, 1e-13, 0)) throw new Error('floor matrix not SPD');
		choleskySolve(a, k, b, x);
		sink += x[0];
	}
	const us = ((performance.now() - t0) * 1000) / systems;
	if (!Number.isFinite(sink)) throw new Error('floor diverged');
	return us;
}

const { k } = workerData as FloorOptions;
const mats = floorMatrices(k);
for (let w = 0; w < 3; w++) pass(mats, k, 20_000);
parentPort!.postMessage('ready');
parentPort!.on('message', (systems: number) => parentPort!.postMessage(pass(mats, k, systems)));
