/**
 * Version of the engine's realization arithmetic. It goes up with any change that would alter a single bit
 * of any realization (random stream, path, search, kriging, transforms, target expansion), so a recipe
 * written by another version is recognised as such instead of silently regenerating different fields.
 *
 * History: ENGINE_VERSIONS.
 */
export const ENGINE_VERSION = 'conefield-sgs/3';

/**
 * Every engine version that ever wrote recipes, oldest first, with what changed: a stored recipe names one
 * of these (engineVersionOf), so the app can tell an old recipe from a foreign or corrupt one.
 */
export const ENGINE_VERSIONS = [
	{ version: 'conefield-sgs/1', change: 'first engine' },
	{
		version: 'conefield-sgs/2',
		change: 'covariances from a table of cubic pieces in reduced distance (TabulatedCovariance); the multiple-grid path as a recipe option (search.path)'
	},
	// An engine of version 2 would ignore a trend it does not know and simulate a different field, hence 3.
	{ version: 'conefield-sgs/3', change: 'a domain may carry a linear trend of the mean (DomainInput.trend)' }
] as const;

/** Whether a recipe was written by this engine version (and so regenerates bit for bit here). */
export function isCurrentEngine(recipe: { engineVersion: string }): boolean {
	return recipe !== null && typeof recipe === 'object' && recipe.engineVersion === ENGINE_VERSION;
}

/**
 * Which of this engine's versions wrote a recipe: its entry in ENGINE_VERSIONS with `current` telling
 * whether it is this one, or null for a version this engine never had (a foreign or corrupt recipe).
 */
export function engineVersionOf(recipe: { engineVersion: string }): { version: string; change: string; current: boolean } | null {
	if (recipe === null || typeof recipe !== 'object') return null;
	const known = ENGINE_VERSIONS.find((v) => v.version === recipe.engineVersion);
	return known ? { ...known, current: known.version === ENGINE_VERSION } : null;
}
