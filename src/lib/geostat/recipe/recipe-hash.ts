import { canonicalJson } from './canonical-json';
import { sha256 } from './sha256';
import type { Recipe } from './schema';

/**
 * SHA-256 (FIPS 180-4) of a recipe's canonical JSON, as 64 hex digits: the recipe's identity. Key order
 * never changes it; any change to a value, the targets or the engine version does.
 */
export function recipeHash(recipe: Recipe): string {
	return sha256(canonicalJson(recipe));
}
