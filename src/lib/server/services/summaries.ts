/**
 * Results derived from a recipe: realization r regenerated on the server, and ensemble maps over its N
 * realizations. Ensemble maps are cached by (recipe hash, stat, threshold) as derived results: deleting them is
 * always safe, since they are recomputed identically (the same realizations, the same accumulation order).
 */
import { and, eq } from 'drizzle-orm';
import type { EnsembleStat } from '$lib/ensemble';
import { ENGINE_VERSION, isCurrentEngine, type Recipe } from '$lib/geostat';
import { getDb } from '$lib/server/db';
import { fromFloat64Blob, toFloat64Blob } from '$lib/server/db/float64';
import { recipeSummaries } from '$lib/server/db/recipe-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
import { ServiceError } from '$lib/server/errors';
import { ensembleMapOffThread, ensembleOf, keptRealization, runRealizations } from '$lib/server/realizations';
import { loadRecipe } from './recipes';

export interface RealizationResult {
	hash: string;
	engineVersion: string;
	realization: number;
	/** NaN where a target is not simulated. */
	values: Float64Array;
}

export interface SummaryResult {
	hash: string;
	stat: EnsembleStat;
	/** The threshold of 'below'; null for the other stats. */
	threshold: number | null;
	realizations: number;
	/** NaN where a target is not simulated. */
	values: Float64Array;
}

/**
 * Realization r of a stored recipe, regenerated on the server's worker pool (or read from the ensemble kept in
 * memory a moment ago).
 * @throws ServiceError 404 for a recipe not in the project, or r outside 0 … N − 1
 */
export async function recipeRealization(projectId: string, recipeId: string, realization: number, db: DbOrTx = getDb()): Promise<RealizationResult> {
	const { hash, recipe, document } = loadRecipe(projectId, recipeId, db);
	const n = recipe.realizations ?? 1;
	if (!Number.isSafeInteger(realization) || realization < 0 || realization >= n) {
		throw new ServiceError(404, `Realization ${realization} does not exist: the recipe has ${n} (0 … ${n - 1}).`);
	}
	checkEngine(recipe);
	const values = keptRealization(hash, realization) ?? (await runRealizations(recipe, [realization], undefined, { hash, document })).get(realization)!;
	return { hash, engineVersion: recipe.engineVersion, realization, values };
}

/**
 * A recipe written by another engine version cannot be regenerated here with the same bits (the engine refuses
 * it): a 409 that says what to do, rather than a failure deep in the worker pool.
 */
export function checkEngine(recipe: Recipe): void {
	if (!isCurrentEngine(recipe)) {
		throw new ServiceError(
			409,
			`This recipe was made by engine ${recipe.engineVersion}; this server runs ${ENGINE_VERSION}, which would not give the same bits. Create it again as a new recipe to regenerate it.`
		);
	}
}

/** The cache key of a threshold: its shortest round-trip form, '' when the stat takes none. */
function thresholdKey(threshold: number | null): string {
	return threshold === null ? '' : String(threshold);
}

const computing = new Map<string, Promise<Float64Array>>();

/**
 * An ensemble map of a stored recipe over its N realizations (ensembleMap in $lib/ensemble), from the cache of
 * derived results or computed on the worker pool and cached.
 * @throws ServiceError 404 for a recipe not in the project
 */
export async function recipeSummary(projectId: string, recipeId: string, stat: EnsembleStat, threshold: number | null, db: DbOrTx = getDb()): Promise<SummaryResult> {
	const { hash, recipe, document } = loadRecipe(projectId, recipeId, db);
	const t = stat === 'below' ? threshold : null;
	const key = { hash, stat, threshold: thresholdKey(t) };
	const n = recipe.realizations ?? 1;
	const cached = db
		.select({ values: recipeSummaries.values })
		.from(recipeSummaries)
		.where(and(eq(recipeSummaries.recipeHash, key.hash), eq(recipeSummaries.stat, key.stat), eq(recipeSummaries.threshold, key.threshold)))
		.get();
	if (cached) return { hash, stat, threshold: t, realizations: n, values: fromFloat64Blob(cached.values) };
	checkEngine(recipe);
	const id = `${key.hash}|${key.stat}|${key.threshold}`;
	let job = computing.get(id);
	if (!job) {
		job = ensembleOf(hash, recipe, document)
			.then((realizations) => ensembleMapOffThread(realizations, stat, t ?? undefined))
			.then((values) => {
				db.insert(recipeSummaries)
					.values({ recipeHash: key.hash, stat: key.stat, threshold: key.threshold, realizations: n, values: toFloat64Blob(values) })
					.onConflictDoNothing()
					.run();
				return values;
			})
			.finally(() => computing.delete(id));
		computing.set(id, job);
	}
	return { hash, stat, threshold: t, realizations: n, values: await job };
}

/** Deletes the cached ensemble maps of a recipe hash (they are recomputed on the next request). */
export function deleteSummaries(hash: string, db: DbOrTx = getDb()): number {
	return db.delete(recipeSummaries).where(eq(recipeSummaries.recipeHash, hash)).run().changes;
}
