import { isCurrentEngine } from './engine-version';
import { recipeInput } from './create-recipe';
import { targetsFromDefinition } from './targets-from-definition';
import { recipeSchema } from './schema';
import type { Recipe } from './schema';
import { simulate } from '../simulation/simulate';

/**
 * Regenerates realization r of a recipe, bit for bit as when it was first simulated by this engine version.
 * @throws {Error} 'recipe is from engine version …' for a recipe of another engine version
 * @throws {RangeError} if the recipe does not pass recipeSchema; and as simulate
 */
export function regenerate(recipe: Recipe, realization: number, onProgress?: (done: number, total: number) => void): Float64Array {
	const parsed = recipeSchema.safeParse(recipe);
	if (!parsed.success) throw new RangeError('invalid recipe');
	if (!isCurrentEngine(recipe)) throw new Error(`recipe is from engine version ${String(recipe.engineVersion)}`);
	return simulate(recipeInput(parsed.data), targetsFromDefinition(parsed.data.targets), realization, onProgress);
}
