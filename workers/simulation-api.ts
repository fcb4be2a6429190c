/**
 * The simulation engine as a worker API, shared by the browser's module Web Worker (simulation.worker.ts)
 * and the server's worker_threads (simulation.node-worker.ts): the same engine code either way, so a
 * realization regenerated in a browser and on the server has the same bits.
 *
 * A worker holds one prepared simulation (prepare once, realize many): the targets and input cross the
 * thread boundary once per run, each realization comes back as a transferred Float64Array.
 */
import * as Comlink from 'comlink';
import { prepareRecipe, prepareSimulation, simulatePrepared, targetsFromDefinition } from '../src/lib/geostat/index';
import type { PrepareOptions, Recipe, SimulationInput, TargetDefinition, TargetPoints } from '../src/lib/geostat/index';
import { ensembleMap, weakZones, type EnsembleStat, type WeakZoneGrid, type WeakZoneOptions } from '../src/lib/ensemble/index';

type Realize = (realization: number, onProgress?: (done: number, total: number) => void) => Float64Array;

/**
 * A realization reports a hundred times (simulatePrepared); each report is a message to the page or the server.
 * Passed on at most this often, which is finer than a progress bar shows: a browser run of the demo's 20
 * realizations sent 2,000 of them, and in Chromium's trace the page's main thread spent 2.6 s on tasks during the
 * run with them all and 2.1 s with these.
 */
export const PROGRESS_POST_MS = 100;

/**
 * What warm() simulates on WARM_GRID: three readings in two soundings, off the grid as soundings usually are, so
 * the engine's search, covariance and kriging code runs and gets compiled before a recipe's run.
 */
const WARM_INPUT: SimulationInput = {
	seed: 'warm-up',
	domains: [
		{
			samples: [
				{ x: 3.4, y: 0, z: -0.6, value: 12, sounding: 'A' },
				{ x: 30.6, y: 0, z: -1.1, value: 20, sounding: 'B' },
				{ x: 30.6, y: 0, z: -1.3, value: 15, sounding: 'B' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1 }] },
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 8, maxSimulated: 12 }
		}
	]
};

/** The section warm() simulates on: 40 × 12 nodes at 1 m × 0.25 m, one domain. */
const WARM_GRID: TargetDefinition = { kind: 'grid', origin: { x: 0, y: 0, z: -2.75 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 40, y: 1, z: 12 }, domainRuns: [[0, 480]] };

/** @param now the clock progress is paced by (milliseconds; tests pass their own) */
export function createSimulationApi(now: () => number = () => performance.now()) {
	let realize: Realize | null = null;
	let preparedKey: string | null = null;
	let preparedActive = 0;
	return {
		/**
		 * Runs two realizations of a small built-in section (WARM_INPUT) and lets them go: the engine's code is then
		 * compiled with type feedback when the first realization of a recipe starts, which the pool asks for before
		 * a run (RealizationPool.warm). Keeps whatever was prepared. Returns the number of nodes simulated.
		 */
		warm(): number {
			const prepared = prepareSimulation(WARM_INPUT, targetsFromDefinition(WARM_GRID));
			simulatePrepared(prepared, 0);
			simulatePrepared(prepared, 1);
			return prepared.active;
		},
		/** Prepares the simulation; returns the number of simulated targets per realization. */
		prepare(input: SimulationInput, targets: TargetPoints): number {
			preparedKey = null;
			realize = null;
			const prepared = prepareSimulation(input, targets);
			realize = (r, cb) => simulatePrepared(prepared, r, cb);
			return prepared.active;
		},
		/**
		 * Prepares a recipe by its kind (the engine's prepareRecipe): only the recipe crosses the thread boundary
		 * (a grid definition is a few numbers where its expanded targets would be megabytes), and the worker
		 * expands the targets. The previous preparation is let go first, so two are never held at once.
		 * @throws {RangeError} on an invalid recipe; {Error} for a recipe of another engine version
		 */
		prepareRecipe(recipe: Recipe, key?: string, options?: PrepareOptions): number {
			preparedKey = null;
			realize = null;
			const prepared = prepareRecipe(recipe, options);
			realize = (r, cb) => prepared.realize(r, cb);
			preparedKey = key ?? null;
			preparedActive = prepared.active;
			return prepared.active;
		},
		/**
		 * The number of simulated targets when the recipe prepared last was prepared under `key` (its hash), else
		 * -1: a worker that keeps serving one recipe prepares it once, and what it keeps between realizations (data
		 * searches, solved systems) keeps paying off across runs. Never changes a bit.
		 */
		preparedAs(key: string): number {
			return realize && preparedKey === key ? preparedActive : -1;
		},
		/**
		 * Realization r of the prepared simulation, in original units (see simulate). Progress crosses to the caller
		 * at most every PROGRESS_POST_MS, and once when the realization is done.
		 */
		realize(realization: number, onProgress?: (done: number, total: number) => void): Float64Array {
			if (!realize) throw new Error('prepare() first');
			let postedAt = -Infinity;
			let postedDone = -1;
			const report = onProgress
				? (d: number, t: number) => {
						const at = now();
						if (d === postedDone || (d < t && at - postedAt < PROGRESS_POST_MS)) return;
						postedAt = at;
						postedDone = d;
						void onProgress(d, t);
					}
				: undefined;
			const out = realize(realization, report);
			return Comlink.transfer(out, [out.buffer]);
		},
		/** An ensemble map of realizations given in realization order (see ensembleMap). */
		ensembleMap(realizations: Float64Array[], stat: EnsembleStat, threshold?: number): Float64Array {
			const out = ensembleMap(realizations, stat, threshold);
			return Comlink.transfer(out, [out.buffer]);
		},
		/** Weak-zone continuity of realizations given in realization order (see weakZones). */
		weakZones(realizations: Float64Array[], grid: WeakZoneGrid, opts: WeakZoneOptions) {
			const out = weakZones(realizations, grid, opts);
			return Comlink.transfer(out, [out.probabilityMap.buffer]);
		}
	};
}

export type SimulationApi = ReturnType<typeof createSimulationApi>;
