// The floor of the simulation benchmarks, measured in a worker thread of its own: copying, factoring and solving
// k×k covariance matrices with the engine's Cholesky (choleskyFactor, choleskySolve) and nothing else. In the
// simulating thread the same loop measured 5.8 to 16 µs a system at k = 31, depending on the type feedback the
// engine's own calls had left on choleskyFactor; here the isolate holds nothing but this loop, and the floor is
// the fastest of several passes (wall time: the thread does nothing else, and the fastest pass is the one least
// disturbed by other work on the box).
import { parentPort, workerData } from 'node:worker_threads';
import { choleskyFactor, choleskySolve, covariance } from '../src/lib/geostat/index';
import type { VariogramModel } from '../src/lib/geostat/index';

export interface FloorRequest {
	k: number;
	systems: number;
	passes: number;
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

const { k, systems, passes } = workerData as FloorRequest;
const mats = floorMatrices(k);
for (let w = 0; w < 3; w++) pass(mats, k, systems); // warm-up: the compiler's work is not the floor
let best = Infinity;
for (let p = 0; p < passes; p++) best = Math.min(best, pass(mats, k, systems));
parentPort!.postMessage(best);
