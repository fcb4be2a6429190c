/**
 * The simulation engine as a worker API, shared by the browser's module Web Worker (simulation.worker.ts)
 * and the server's worker_threads (simulation.node-worker.ts): the same engine code either way, so a
 * realization regenerated in a browser and on the server has the same bits.
 *
 * A worker holds one prepared simulation (prepare once, realize many): the targets and input cross the
 * thread boundary once per run, each realization comes back as a transferred Float64Array.
 */
import * as Comlink from 'comlink';
import {
	isCurrentEngine,
	prepareSimulation,
	recipeInput,
	recipeSchema,
	simulatePrepared,
	targetsFromDefinition
} from '../src/lib/geostat/index';
import type { PreparedSimulation, Recipe, SimulationInput, TargetPoints } from '../src/lib/geostat/index';

export function createSimulationApi() {
	let prepared: PreparedSimulation | null = null;
	return {
		/** Prepares the simulation; returns the number of simulated targets per realization. */
		prepare(input: SimulationInput, targets: TargetPoints): number {
			prepared = prepareSimulation(input, targets);
			return prepared.active;
		},
		/**
		 * Prepares a recipe's simulation: only the recipe crosses the thread boundary (a grid definition is a
		 * few numbers where its expanded targets would be megabytes), and the worker expands the targets.
		 * @throws {RangeError} on an invalid recipe; {Error} for a recipe of another engine version
		 */
		prepareRecipe(recipe: Recipe): number {
			const parsed = recipeSchema.parse(recipe);
			if (!isCurrentEngine(parsed)) throw new Error(`recipe is from engine version ${parsed.engineVersion}`);
			prepared = prepareSimulation(recipeInput(parsed), targetsFromDefinition(parsed.targets));
			return prepared.active;
		},
		/** Realization r of the prepared simulation, in original units (see simulate). */
		realize(realization: number, onProgress?: (done: number, total: number) => void): Float64Array {
			if (!prepared) throw new Error('prepare() first');
			const out = simulatePrepared(prepared, realization, onProgress ? (d, t) => void onProgress(d, t) : undefined);
			return Comlink.transfer(out, [out.buffer]);
		}
	};
}

export type SimulationApi = ReturnType<typeof createSimulationApi>;
