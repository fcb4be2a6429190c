// Sequential Gaussian simulation benchmarks (issues 4 and 16): "section", "section-offgrid", "block" (each also
// on the multiple-grid path, ":multigrid"; the sections also on constant paths, ":constant" and
// ":multigrid-constant", whose realizations after the first replay the first's weights) and "pool" (also
// ":constant"). On a constant path a replayed node counts as a node simulated and a solution reused.
// Each simulation case is set against a floor: copying, factoring and solving one k×k system with the engine's
// own Cholesky (k = the mean neighbour count the simulation actually used), measured in a worker thread of its
// own (floor.worker.ts) in a pass after each realization — so `ratio` says what search, covariance build and bookkeeping cost on top of the
// unavoidable solves, or, with solved systems reused, how far below it the engine goes. Per case, each on a fresh
// prepared simulation after an untimed warm-up realization with the same options (so the compiler's warm-up is
// not counted; the block's on its top layers): `ratio` and `hitRate` (share of systems whose solution was reused) with everything kept (the
// default); `ratioNoReuse` keeping the data parts but no solved systems; `ratioFresh` keeping nothing
// (reuseBytes 0). A prepared simulation's first realization also searches every target's data and fills what is
// kept (work a preparation pays once, like prepareMs), so with R > 1 realizations the figures are those of
// realizations 1…R−1 (`ratio`: the median of their ratios, each against the floor's pass right after it, which
// shares the box's state of the moment) and the first is reported apart (`msFirstRealization`, `ratioFirst`); the
// block runs one realization, so its figures are its first.
import seedrandom from 'seedrandom';
import { median } from 'simple-statistics';
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { prepareSimulation, recipeInput, simulatePrepared, targetsFromDefinition } from '../src/lib/geostat/index';
import type { PathOrder, PrepareOptions, SimulationInput, SimulationStats, TargetPoints, VariogramModel, Sample } from '../src/lib/geostat/index';
import { createNodePool } from '../workers/node-pool';
import { demoRecipe } from '../scripts/demo-recipe';
import type { BenchCase } from './index';

// CPU time of this process, not wall time: other work shares the box, and a realization that waits for a core
// should not count as slower.
const cpuMs = () => {
	const u = process.cpuUsage();
	return (u.user + u.system) / 1000;
};

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

export function blockInput(): { input: SimulationInput; targets: TargetPoints } {
	// 100 × 100 × 100 = 1,000,000 targets at 2 × 2 × 0.25 m (200 m × 200 m × 25 m), 25 soundings.
	const targets = grid(100, 100, 100, 2, 2, 0.25);
	const model: VariogramModel = { azimuth: 0, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 1.5 }] };
	const plan: [number, number][] = [];
	for (let a = 0; a < 5; a++) for (let b = 0; b < 5; b++) plan.push([20 + 40 * a, 20 + 40 * b]);
	const samples = soundings(plan, 100);
	return { targets, input: { seed: 'bench-block', domains: [{ samples, model, transform: 'normal-score', kriging: 'simple', search: { maxData: 16, maxSimulated: 16 } }] } };
}

function offgridInput(): { input: SimulationInput; targets: TargetPoints } {
	// The demo's own domain samples (five domains, 0.2 m windows at the soundings' chainages: off the lattice) on a
	// 400 × 80 section at 1 m × 0.2 m (about 32,000 cells); exponential 40 m / 0.9 m; 16 data (≤ 8 a sounding), 16 nodes.
	const recipe = demoRecipe({ seed: 'bench-section-offgrid' });
	return { input: recipeInput(recipe), targets: targetsFromDefinition(recipe.targets) };
}

/**
 * The floor: microseconds to copy, factor and solve one k×k system with the engine's Cholesky, measured in a
 * worker thread of its own (see floor.worker.ts for why). One pass follows each realization, so the two share the
 * box's state of the moment: here a realization's time can swing by 50 % over minutes with other work on the host.
 */
class Floor {
	private readonly worker: Worker;
	private readonly ready: Promise<void>;
	constructor(readonly k: number) {
		this.worker = new Worker(new URL('../workers/node-worker-bootstrap.mjs', import.meta.url), {
			workerData: { entry: new URL('./floor.worker.ts', import.meta.url).href, k }
		});
		this.ready = this.next().then(() => undefined);
	}
	private next(): Promise<unknown> {
		return new Promise((resolve, reject) => {
			const onError = (err: Error) => reject(err);
			this.worker.once('error', onError);
			this.worker.once('message', (m) => {
				this.worker.off('error', onError);
				resolve(m);
			});
		});
	}
	/** Milliseconds the worker takes for `systems` systems (one pass). */
	async ms(systems: number): Promise<number> {
		await this.ready;
		const answer = this.next();
		this.worker.postMessage(systems);
		return ((await answer) as number) * systems / 1000;
	}
	close(): Promise<number> {
		return this.worker.terminate();
	}
}

/** One realization: CPU ms, systems, neighbours and reused systems, and the floor's µs a system in the pass after it. */
interface Realization {
	ms: number;
	systems: number;
	neighbours: number;
	reused: number;
	replayed: number;
	floorUs: number;
}

interface Run {
	realizations: Realization[];
	prepareMs: number;
	cacheMB: number;
}

/**
 * Realizations 0…R−1 of one prepared simulation, timed in CPU time of this process (see cpuMs), each followed by a
 * pass of the floor over as many systems (at most 200,000); the case's floor starts at the first realization's k.
 */
async function run(input: SimulationInput, targets: TargetPoints, realizations: number, options: PrepareOptions, floor: { at: Floor | null }): Promise<Run> {
	const t0 = cpuMs();
	const prep = prepareSimulation(input, targets, options);
	const out: Run = { realizations: [], prepareMs: cpuMs() - t0, cacheMB: 0 };
	sampleRss();
	for (let r = 0; r < realizations; r++) {
		const stats: SimulationStats = { systems: 0, neighbours: 0, reused: 0, replayed: 0 };
		const t1 = cpuMs();
		simulatePrepared(prep, r, sampleRss, stats);
		const ms = cpuMs() - t1;
		sampleRss();
		floor.at ??= new Floor(Math.round(stats.neighbours / stats.systems));
		const m = Math.min(stats.systems + stats.replayed, 200_000);
		const floorUs = ((await floor.at.ms(m)) * 1000) / m;
		out.realizations.push({ ms, ...stats, floorUs });
	}
	out.cacheMB = prep.cache && prep.cache.stores > 0 ? prep.cache.bytes / 2 ** 20 : 0;
	return out;
}

const round2 = (v: number) => Math.round(v * 100) / 100;

/** The realizations a case's figures come from: 1…R−1, or the only one (see the head of this file). */
const steady = (r: Run) => (r.realizations.length > 1 ? r.realizations.slice(1) : r.realizations);
/** Nodes simulated: those whose system was solved (or taken from the cache) and those replayed from a plan. */
const nodesOf = (z: Realization) => z.systems + z.replayed;
const ratioOf = (z: Realization) => (z.ms * 1000) / nodesOf(z) / z.floorUs;
const sum = (zs: Realization[], f: (z: Realization) => number) => zs.reduce((t, z) => t + f(z), 0);

/** The input with every domain on the given path. */
function withPath(input: SimulationInput, path: PathOrder): SimulationInput {
	return { ...input, domains: input.domains.map((d) => ({ ...d, search: { ...d.search, path } })) };
}

/** The first n targets (of a grid in layers: its top layers). */
function head(t: TargetPoints, n: number): TargetPoints {
	const m = Math.min(n, t.x.length);
	return { x: t.x.subarray(0, m), y: t.y.subarray(0, m), z: t.z.subarray(0, m), domain: t.domain.subarray(0, m) };
}

/** One simulation case on one path (see the head of this file). */
async function simulationCase(
	name: string,
	setup: () => { input: SimulationInput; targets: TargetPoints },
	realizations: number,
	path: PathOrder
): Promise<Record<string, number>> {
	const base = setup();
	const input = withPath(base.input, path);
	const { targets } = base;
	// Each configuration warmed up on a throwaway preparation first, so none is timed while the compiler still
	// learns its paths (the block, a realization at a time, on its top 100,000 cells: the same lattice and code paths).
	const floor: { at: Floor | null } = { at: null };
	// (The block's warm-up keeps at most 8 MiB, so its garbage does not count in the block's peak memory.)
	const warm = realizations > 1 ? targets : head(targets, 100_000);
	const measure = (options: PrepareOptions): Promise<Run> => {
		const small = realizations > 1 ? options : { ...options, reuseBytes: Math.min(options.reuseBytes ?? 2 ** 23, 2 ** 23) };
		simulatePrepared(prepareSimulation(input, warm, small), 999);
		return run(input, targets, realizations, options, floor);
	};
	sampleRss();
	peakRss = process.memoryUsage().rss;
	const on = await measure({});
	const peak = peakRss;
	const off = await measure({ reuseSolutions: false });
	const fresh = realizations > 1 ? await measure({ reuseBytes: 0 }) : null;
	await floor.at?.close();
	const s = steady(on);
	const sOff = steady(off);
	const first = on.realizations[0];
	const nodes = sum(s, nodesOf);
	return {
		nodes: nodesOf(first),
		targets: targets.x.length,
		// Of the systems built (a replayed realization builds none: then those of the first).
		k: round2(s.some((z) => z.systems > 0) ? sum(s, (z) => z.neighbours) / sum(s, (z) => z.systems) : first.neighbours / first.systems),
		prepareMs: Math.round(on.prepareMs),
		msPerRealization: Math.round(sum(s, (z) => z.ms) / s.length),
		usPerNode: round2((sum(s, (z) => z.ms) * 1000) / nodes),
		floorUsPerNode: round2(median(s.map((z) => z.floorUs))),
		ratio: round2(median(s.map(ratioOf))),
		hitRate: round2(sum(s, (z) => z.reused + z.replayed) / nodes),
		...(realizations > 1 ? { msFirstRealization: Math.round(first.ms), ratioFirst: round2(ratioOf(first)) } : {}),
		msPerRealizationNoReuse: Math.round(sum(sOff, (z) => z.ms) / sOff.length),
		ratioNoReuse: round2(median(sOff.map(ratioOf))),
		...(fresh ? { ratioFresh: round2(median(steady(fresh).map(ratioOf))) } : {}),
		cacheMB: Math.round(on.cacheMB),
		...(name.startsWith('block') ? { peakRssMB: Math.round(peak / 2 ** 20) } : {})
	};
}

async function poolCase(path: PathOrder): Promise<Record<string, number>> {
	const base = sectionInput();
	const { targets } = base;
	const input = withPath(base.input, path);
	const realizations = Array.from({ length: 8 }, (_, r) => r);
	const cores = availableParallelism();
	// Wall clock (what a user waits) and CPU time of this process, workers included (what the work costs, whatever
	// else shares the box).
	const time = async (size: number) => {
		const pool = createNodePool({ size });
		// Warm-up: workers start (and load the engine through tsx) outside the timing.
		await pool.run(input, targets, Array.from({ length: size }, (_, r) => 100 + r));
		const c0 = cpuMs();
		const t0 = performance.now();
		await pool.run(input, targets, realizations);
		const ms = performance.now() - t0;
		const cpu = cpuMs() - c0;
		await pool.close();
		return { ms, cpu };
	};
	const one = await time(1);
	const all = await time(cores);
	return {
		realizations: 8,
		cores,
		msOneCore: Math.round(one.ms),
		msAllCores: Math.round(all.ms),
		speedup: Math.round((one.ms / all.ms) * 100) / 100,
		cpuMsAllCores: Math.round(all.cpu)
	};
}

const cases: BenchCase[] = [
	{ name: 'section', run: () => simulationCase('section', sectionInput, 5, 'random') },
	{ name: 'section:multigrid', run: () => simulationCase('section', sectionInput, 5, 'multigrid') },
	{ name: 'section-offgrid', run: () => simulationCase('section-offgrid', offgridInput, 7, 'random') },
	{ name: 'section-offgrid:multigrid', run: () => simulationCase('section-offgrid', offgridInput, 7, 'multigrid') },
	{ name: 'section:constant', run: () => simulationCase('section', sectionInput, 5, 'random-constant') },
	{ name: 'section:multigrid-constant', run: () => simulationCase('section', sectionInput, 5, 'multigrid-constant') },
	{ name: 'section-offgrid:constant', run: () => simulationCase('section-offgrid', offgridInput, 7, 'random-constant') },
	{ name: 'section-offgrid:multigrid-constant', run: () => simulationCase('section-offgrid', offgridInput, 7, 'multigrid-constant') },
	{ name: 'block', run: () => simulationCase('block', blockInput, 1, 'random') },
	{ name: 'block:multigrid', run: () => simulationCase('block', blockInput, 1, 'multigrid') },
	{ name: 'pool', run: () => poolCase('random') },
	{ name: 'pool:constant', run: () => poolCase('random-constant') }
];

export default cases;
