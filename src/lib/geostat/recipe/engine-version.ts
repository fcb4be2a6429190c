/**
 * Version of the engine's realization arithmetic. It goes up with any change that would alter a single bit
 * of any realization (random stream, path, search, kriging, transforms, target expansion), so a recipe
 * written by another version is recognised as such instead of silently regenerating different fields.
 *
 * History: 1 — first engine; 2 — covariances from a table of cubic pieces in reduced distance
 * (TabulatedCovariance), and the multiple-grid path as a recipe option (search.path).
 */
export const ENGINE_VERSION = 'conefield-sgs/2';

/** Whether a recipe was written by this engine version (and so regenerates bit for bit here). */
export function isCurrentEngine(recipe: { engineVersion: string }): boolean {
	return recipe !== null && typeof recipe === 'object' && recipe.engineVersion === ENGINE_VERSION;
}
