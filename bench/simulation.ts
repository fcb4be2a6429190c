// Sequential Gaussian simulation benchmarks (issue 4): "section", "block" and "pool".
// Each simulation case also times, in the same process, a floor: factoring and solving as many k×k systems
// with the plain Float64Array Cholesky (k = the mean neighbour count the simulation actually used), so
// `ratio` says what search, covariance build and bookkeeping cost on top of the unavoidable solves.
import seedrandom from 'seedrandom';
import { availableParallelism } from 'node:os';
import { choleskyFactor, choleskySolve, covariance, prepareSimulation, simulatePrepared } from '../src/lib/geostat/index';
import type { SimulationInput, SimulationStats, TargetPoints, VariogramModel, Sample } from '../src/lib/geostat/index';
import { createNodePool } from '../workers/node-pool';
import type { BenchCase } from './index';

let peakRss = process.memoryUsage().rss;
const sampleRss = () => {
	const r = process.memoryUsage().rss;
	if (r > peakRss) peakRss = r;
};

function grid(nx: number, ny: number, nz: number, dx: number, dy: number, dz: number): TargetPoints {
	const n = nx * ny * nz;
	const t: TargetPoints = { x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n), domain: new Int32Array(n) };
	let p = 0;
	for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++, p++) {
		t.x[p] = i * dx;
		t.y[p] = j * dy;
		t.z[p] = -k * dz;
	}
	return t;
}

/** Soundings at the given plan positions, a reading every 0.25 m; values lognormal-like, correlated with depth. */
function soundings(plan: [number, number][], readings: number): Sample[] {
	const rng = seedrandom.alea('bench-soundings');
	const out: Sample[] = [];
	plan.forEach(([x, y], s) => {
		let g = 0;
		for (let k = 0; k < readings; k++) {
			g = 0.8 * g + 0.6 * (rng() + rng() + rng() - 1.5) * 2;
			out.push({ x, y, z: -k * 0.25, value: 5 * Math.exp(0.4 * g), sounding: `S${s}` });
		}
	});
	return out;
}

function sectionInput(): { input: SimulationInput; targets: TargetPoints } {
	// 400 m × 30 m at 1 × 0.25 m: 400 × 120 = 48,000 targets; 40 soundings through the full 30 m.
	const targets = grid(400, 1, 120, 1, 1, 0.25);
	const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 1 }] };
	const samples = soundings(Array.from({ length: 40 }, (_, b) => [5 + 10 * b, 0] as [number, number]), 120);
	return { targets, input: { seed: 'bench-section', domains: [{ samples, model, transform: 'normal-score', kriging: 'simple', search: { maxData: 16, maxSimulated: 16 } }] } };
}

function blockInput(): { input: SimulationInput; targets: TargetPoints } {
	// 100 × 100 × 100 = 1,000,000 targets at 2 × 2 × 0.25 m (200 m × 200 m × 25 m), 25 soundings.
	const targets = grid(100, 100, 100, 2, 2, 0.25);
	const model: VariogramModel = { azimuth: 0, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 1.5 }] };
	const plan: [number, number][] = [];
	for (let a = 0; a < 5; a++) for (let b = 0; b < 5; b++) plan.push([20 + 40 * a, 20 + 40 * b]);
	const samples = soundings(plan, 100);
	return { targets, input: { seed: 'bench-block', domains: [{ samples, model, transform: 'normal-score', kriging: 'simple', search: { maxData: 16, maxSimulated: 16 } }] } };
}

/** Covariance matrices of k points along a line: SPD with realistic conditioning, for the floor. */
function floorMatrices(k: number): Float64Array[] {
	const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 1 }] };
	return Array.from({ length: 64 }, (_, s) => {
		const a = new Float64Array(k * k);
		for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) a[i * k + j] = covariance(model, (i - j) * (1 + s / 64) * 2.3, 0, 0);
		return a;
	});
}

/** Milliseconds to copy, factor and solve `systems` k×k systems with the plain Float64Array Cholesky. */
function floorMs(mats: Float64Array[], k: number, systems: number): number {
	const a = new Float64Array(k * k);
	const b = new Float64Array(k).fill(0.5);
	const x = new Float64Array(k);
	let sink = 0;
	const t0 = performance.now();
	for (let s = 0; s < systems; s++) {
		a.set(mats[s % mats.length]);
		if (!choleskyFactor(a, k)) throw new Error('floor matrix not SPD');
		choleskySolve(a, k, b, x);
		sink += x[0];
	}
	const ms = performance.now() - t0;
	if (!Number.isFinite(sink)) throw new Error('floor diverged');
	return ms;
}

function simulationCase(name: string, setup: () => { input: SimulationInput; targets: TargetPoints }, realizations: number): Record<string, number> {
	const { input, targets } = setup();
	sampleRss();
	const t0 = performance.now();
	const prep = prepareSimulation(input, targets);
	const prepareMs = performance.now() - t0;
	sampleRss();
	// The box is shared with other work; timing each realization next to its floor keeps the ratio fair.
	let simMs = 0;
	let floorTotalMs = 0;
	let floorSystems = 0;
	let systems = 0;
	let neighbours = 0;
	let mats: Float64Array[] | null = null;
	let k = 0;
	for (let r = 0; r < realizations; r++) {
		const stats: SimulationStats = { systems: 0, neighbours: 0 };
		const t1 = performance.now();
		simulatePrepared(prep, r, sampleRss, stats);
		simMs += performance.now() - t1;
		sampleRss();
		systems += stats.systems;
		neighbours += stats.neighbours;
		if (!mats) {
			k = Math.round(stats.neighbours / stats.systems);
			mats = floorMatrices(k);
		}
		const m = Math.min(stats.systems, 200_000);
		floorTotalMs += floorMs(mats, k, m);
		floorSystems += m;
	}
	const nodes = systems / realizations;
	const usPerNode = (simMs * 1000) / systems;
	const floorUs = (floorTotalMs * 1000) / floorSystems;
	return {
		nodes,
		targets: targets.x.length,
		k: Math.round((neighbours / systems) * 100) / 100,
		prepareMs: Math.round(prepareMs),
		msPerRealization: Math.round(simMs / realizations),
		usPerNode: Math.round(usPerNode * 100) / 100,
		floorUsPerNode: Math.round(floorUs * 100) / 100,
		ratio: Math.round((usPerNode / floorUs) * 100) / 100,
		...(name === 'block' ? { peakRssMB: Math.round(peakRss / 2 ** 20) } : {})
	};
}

async function poolCase(): Promise<Record<string, number>> {
	const { input, targets } = sectionInput();
	const realizations = Array.from({ length: 8 }, (_, r) => r);
	const cores = availableParallelism();
	const time = async (size: number) => {
		const pool = createNodePool({ size });
		// Warm-up: workers start (and load the engine through tsx) outside the timing.
		await pool.run(input, targets, Array.from({ length: size }, (_, r) => 100 + r));
		const t0 = performance.now();
		await pool.run(input, targets, realizations);
		const ms = performance.now() - t0;
		await pool.close();
		return ms;
	};
	const one = await time(1);
	const all = await time(cores);
	return { realizations: 8, cores, msOneCore: Math.round(one), msAllCores: Math.round(all), speedup: Math.round((one / all) * 100) / 100 };
}

const cases: BenchCase[] = [
	{ name: 'section', run: () => simulationCase('section', sectionInput, 3) },
	{ name: 'block', run: () => simulationCase('block', blockInput, 1) },
	{ name: 'pool', run: poolCase }
];

export default cases;
