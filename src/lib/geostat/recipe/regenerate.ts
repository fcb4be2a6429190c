import { prepareRecipe } from './prepare-recipe';
import type { Recipe } from './schema';

/**
 * Regenerates realization r of a recipe, bit for bit as when it was first made by this engine version, by the
 * recipe's kind (prepareRecipe).
 * @throws {Error} 'recipe is from engine version …' for a recipe of another engine version
 * @throws {RangeError} if the recipe does not pass recipeSchema, r is not below its N realizations; and as simulate
 */
export function regenerate(recipe: Recipe, realization: number, onProgress?: (done: number, total: number) => void): Float64Array {
	// One realization: nothing is kept per target for a next one (as simulate()).
	return prepareRecipe(recipe, { keepPerTarget: false }).realize(realization, onProgress);
}
