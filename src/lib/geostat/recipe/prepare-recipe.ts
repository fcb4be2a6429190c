import { isCurrentEngine } from './engine-version';
import { recipeInput } from './create-recipe';
import { targetsFromDefinition } from './targets-from-definition';
import { recipeSchema } from './schema';
import type { Recipe, RecipeKind } from './schema';
import { prepareUniform } from './uniform';
import { prepareSimulation, type PrepareOptions } from '../simulation/prepare-simulation';
import { simulatePrepared } from '../simulation/simulate';

/** A recipe made ready to realize: the one place that dispatches on the recipe's kind. */
export interface PreparedRecipe {
	kind: RecipeKind;
	/** Number of targets with a domain (simulated in each realization). */
	active: number;
	/** The ensemble's size N when the recipe states it, else null (any realization number is allowed). */
	realizations: number | null;
	/**
	 * Realization r, in original units (NaN where a target has no domain), bit for bit as when it was first
	 * made by this engine version.
	 * @throws {RangeError} if r is not an integer >= 0, or not below the recipe's N
	 */
	realize(realization: number, onProgress?: (done: number, total: number) => void): Float64Array;
}

/**
 * Validates a recipe and prepares what does not depend on the realization number, by its kind: 'sgs' (the
 * default) prepares a sequential Gaussian simulation of its input at its targets (prepareSimulation); 'uniform'
 * checks its values against its data and fills each domain with its value at the realization's percentile
 * (prepareUniform).
 * Does not mutate the recipe. `options` go to prepareSimulation (what an 'sgs' recipe keeps for reuse; never a bit).
 * @throws {RangeError} 'invalid recipe: …' if the recipe does not pass recipeSchema; and as prepareSimulation or
 *   prepareUniform
 * @throws {Error} 'recipe is from engine version …' for a recipe of another engine version
 */
export function prepareRecipe(recipe: Recipe, options?: PrepareOptions): PreparedRecipe {
	const parsed = recipeSchema.safeParse(recipe);
	if (!parsed.success) {
		throw new RangeError(`invalid recipe: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
	}
	if (!isCurrentEngine(recipe)) throw new Error(`recipe is from engine version ${String(recipe.engineVersion)}`);
	const r = parsed.data;
	const n = r.realizations ?? null;
	const inRange = (realization: number) => {
		if (!Number.isSafeInteger(realization) || realization < 0) throw new RangeError('realization must be an integer >= 0');
		if (n !== null && realization >= n) throw new RangeError(`realization ${realization} is beyond the recipe's ${n} realizations`);
	};
	if (r.kind === 'uniform') {
		const prepared = prepareUniform(r);
		return {
			kind: 'uniform',
			active: prepared.active,
			realizations: n,
			realize(realization, onProgress) {
				inRange(realization);
				const out = prepared.realize(realization);
				onProgress?.(prepared.active, prepared.active);
				return out;
			}
		};
	}
	// No kind means 'sgs' (recipes written before kinds existed).
	const prepared = prepareSimulation(recipeInput(r), targetsFromDefinition(r.targets), options);
	return {
		kind: 'sgs',
		active: prepared.active,
		realizations: n,
		realize(realization, onProgress) {
			inRange(realization);
			return simulatePrepared(prepared, realization, onProgress);
		}
	};
}
