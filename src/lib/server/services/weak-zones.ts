/**
 * Weak-zone continuity of a stored recipe (GET …/recipes/:rid/weak-zones): for a property and a threshold, the
 * weak zones of each of its N realizations (regenerated on the server's worker pool, as the summaries), their
 * figures, and the probability map of cells in zones at least minLength long. Cached by (hash, property,
 * threshold, minLength, boundary line) as a derived result. A screening measure of lateral continuity, not a
 * liquefaction triggering or deformation analysis.
 */
import { and, eq } from 'drizzle-orm';
import type { RealizationWeakZones } from '$lib/ensemble';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { boundarySides } from '$lib/site';
import { getDb } from '$lib/server/db';
import { fromFloat64Blob, toFloat64Blob } from '$lib/server/db/float64';
import { recipeWeakZones } from '$lib/server/db/recipe-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
import { InvalidInput } from '$lib/server/errors';
import { ensembleOf, weakZonesOffThread } from '$lib/server/realizations';
import type { WeakZonesQuery } from '$lib/schemas/recipe';
import { getRecipe, loadRecipe } from './recipes';
import { checkEngine } from './summaries';
import { getSite } from './site';
import { listZoneBoundaries } from './stratigraphy';

/** The weak-zones endpoint's answer (the contract's shape; the map has NaN where null is sent). */
export interface WeakZonesResult {
	property: SimulatedProperty;
	threshold: number;
	minLength: number;
	/** The recipe's domain indices that simulate the property: only their cells can be weak. */
	domains: number[];
	realizations: (RealizationWeakZones & { realization: number })[];
	/** Null without a boundary. */
	crossingProbability: number | null;
	/** Per target: the fraction of realizations in which it lies in a weak zone at least minLength long; NaN where the property is not simulated. */
	probabilityMap: Float64Array;
}

interface CachedFigures {
	domains: number[];
	realizations: (RealizationWeakZones & { realization: number })[];
	crossingProbability: number | null;
}

const computing = new Map<string, Promise<{ figures: CachedFigures; map: Float64Array }>>();

/**
 * Weak-zone continuity of a recipe's realizations (weakZones in $lib/ensemble), from the cache of derived results
 * or computed on the worker pool and cached. Weak cells are those of the domains simulating `property` with a
 * value strictly below `threshold`; zones join across those domains. With a zone boundary, crossesBoundary tells
 * whether a weak zone holds cells on both sides of its line (boundarySides: the line extended across the grid).
 * @throws ServiceError 404 for a recipe not in the project; InvalidInput (422) for a property the recipe does
 *   not simulate, a boundary not in the project, targets that are not a regular grid, or a 3D boundary without
 *   a section line
 */
export async function recipeWeakZonesOf(projectId: string, recipeId: string, query: WeakZonesQuery, db: DbOrTx = getDb()): Promise<WeakZonesResult> {
	const view = getRecipe(projectId, recipeId, db);
	const { hash, recipe } = loadRecipe(projectId, recipeId, db);
	const { property, threshold, minLength } = query;
	const domains = view.provenance.domains.filter((d) => d.index !== null && d.property === property).map((d) => d.index!).sort((a, b) => a - b);
	if (domains.length === 0) {
		const has = [...new Set(view.provenance.domains.filter((d) => d.index !== null).map((d) => PROPERTY_INFO[d.property].label))];
		throw new InvalidInput(`${view.name} does not simulate ${PROPERTY_INFO[property].label}; it simulates ${has.join(', ')}.`, [{ path: ['property'], message: `Choose one of: ${has.join(', ')}.` }]);
	}
	if (recipe.targets.kind !== 'grid') {
		throw new InvalidInput('Weak zones are labelled on a regular grid; this recipe’s targets are not one.', [{ path: [], message: 'Not a grid.' }]);
	}
	const targets = recipe.targets;
	let line: { chainageTop: number; elevationTop: number; chainageBottom: number; elevationBottom: number } | null = null;
	if (query.boundary) {
		const found = listZoneBoundaries(projectId, db).find((b) => b.id === query.boundary);
		if (!found) throw new InvalidInput('That zone boundary is not in this project.', [{ path: ['boundary'], message: 'Unknown zone boundary.' }]);
		line = { chainageTop: found.chainageTop, elevationTop: found.elevationTop, chainageBottom: found.chainageBottom, elevationBottom: found.elevationBottom };
	}
	const key = {
		recipeHash: hash,
		property,
		threshold: String(threshold),
		minLength: String(minLength),
		boundary: line ? [line.chainageTop, line.elevationTop, line.chainageBottom, line.elevationBottom].map(String).join(',') : ''
	};
	const cached = db
		.select({ figures: recipeWeakZones.figures, map: recipeWeakZones.map })
		.from(recipeWeakZones)
		.where(
			and(
				eq(recipeWeakZones.recipeHash, key.recipeHash),
				eq(recipeWeakZones.property, key.property),
				eq(recipeWeakZones.threshold, key.threshold),
				eq(recipeWeakZones.minLength, key.minLength),
				eq(recipeWeakZones.boundary, key.boundary)
			)
		)
		.get();
	if (cached) return { property, threshold, minLength, ...(cached.figures as CachedFigures), probabilityMap: fromFloat64Blob(cached.map) };

	checkEngine(recipe);
	const { counts, spacing } = targets;
	const site = getSite(projectId, db);
	let side: Int8Array | undefined;
	if (line) {
		side = boundarySides({ origin: targets.origin, spacing, counts }, line, { geometry: site.geometry, sectionLine: site.sectionLine });
		if (side.every((s) => s < 0)) throw new InvalidInput('A boundary in 3D needs the section line to place it: set one under Stratigraphy.', [{ path: ['boundary'], message: 'No section line.' }]);
	}
	const id = Object.values(key).join('|');
	let job = computing.get(id);
	if (!job) {
		const eligible = new Uint8Array(counts.x * counts.y * counts.z);
		let p = 0;
		const wanted = new Set(domains);
		for (const [d, len] of targets.domainRuns) {
			if (wanted.has(d)) eligible.fill(1, p, p + len);
			p += len;
		}
		job = ensembleOf(hash, recipe)
			.then((realizations) =>
				weakZonesOffThread(realizations, { counts, spacing }, { threshold, eligible, minLength, side, section: site.geometry === '2d' })
			)
			.then((sum) => {
				const figures: CachedFigures = {
					domains,
					realizations: sum.realizations.map((r, realization) => ({ realization, ...r })),
					crossingProbability: sum.crossingProbability
				};
				db.insert(recipeWeakZones).values({ ...key, figures, map: toFloat64Blob(sum.probabilityMap) }).onConflictDoNothing().run();
				return { figures, map: sum.probabilityMap };
			})
			.finally(() => computing.delete(id));
		computing.set(id, job);
	}
	const { figures, map } = await job;
	return { property, threshold, minLength, ...figures, probabilityMap: map };
}
