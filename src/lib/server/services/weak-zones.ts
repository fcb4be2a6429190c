/**
 * Weak-zone continuity of a stored recipe (GET …/recipes/:rid/weak-zones): for a property and a threshold, the
 * weak zones of each of its N realizations (regenerated on the server's worker pool, as the summaries), their
 * figures, and the probability map of cells in zones at least minLength long. Cached by (hash, property,
 * threshold, minLength, boundary line) as a derived result. A screening measure of lateral continuity, not a
 * liquefaction triggering or deformation analysis.
 */
import { and, eq } from 'drizzle-orm';
import type { RealizationWeakZones, WeakZoneGrid } from '$lib/ensemble';
import type { Recipe } from '$lib/geostat';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { boundarySides, type GridDefinition } from '$lib/site';
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
 * On a grid of variable cell heights (rectilinear targets) the zones are labelled the same way and their areas
 * sum the heights of their rows (the provenance's cell edges).
 * @throws ServiceError 404 for a recipe not in the project; InvalidInput (422) for a property the recipe does
 *   not simulate, a boundary not in the project, targets that are not a grid (a mesh), or a 3D boundary without
 *   a section line
 */
export async function recipeWeakZonesOf(projectId: string, recipeId: string, query: WeakZonesQuery, db: DbOrTx = getDb()): Promise<WeakZonesResult> {
	const view = getRecipe(projectId, recipeId, db);
	const { hash, recipe, document } = loadRecipe(projectId, recipeId, db);
	const { property, threshold, minLength } = query;
	const domains = view.provenance.domains.filter((d) => d.index !== null && d.property === property).map((d) => d.index!).sort((a, b) => a - b);
	if (domains.length === 0) {
		const has = [...new Set(view.provenance.domains.filter((d) => d.index !== null).map((d) => PROPERTY_INFO[d.property].label))];
		throw new InvalidInput(`${view.name} does not simulate ${PROPERTY_INFO[property].label}; it simulates ${has.join(', ')}.`, [{ path: ['property'], message: `Choose one of: ${has.join(', ')}.` }]);
	}
	const grid = labelledGrid(recipe, view.provenance.grid?.zEdges);
	if (!grid) {
		throw new InvalidInput('Weak zones are labelled on a grid of cells; this recipe’s targets are the elements of a mesh.', [{ path: [], message: 'Not a grid.' }]);
	}
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
	const { counts, spacing, heights } = grid;
	const site = getSite(projectId, db);
	let side: Int8Array | undefined;
	if (line) {
		side = boundarySides(grid.definition, line, { geometry: site.geometry, sectionLine: site.sectionLine });
		if (side.every((s) => s < 0)) throw new InvalidInput('A boundary in 3D needs the section line to place it: set one under Stratigraphy.', [{ path: ['boundary'], message: 'No section line.' }]);
	}
	const id = Object.values(key).join('|');
	let job = computing.get(id);
	if (!job) {
		const eligible = new Uint8Array(counts.x * counts.y * counts.z);
		let p = 0;
		const wanted = new Set(domains);
		for (const [d, len] of recipe.targets.kind === 'points' ? [] : recipe.targets.domainRuns) {
			if (wanted.has(d)) eligible.fill(1, p, p + len);
			p += len;
		}
		job = ensembleOf(hash, recipe, document)
			.then((realizations) =>
				weakZonesOffThread(realizations, { counts, spacing, ...(heights ? { heights } : {}) }, { threshold, eligible, minLength, side, section: site.geometry === '2d' })
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

/**
 * The grid a recipe's zones are labelled on: a regular grid as it is; a rectilinear one (uniform columns, variable
 * cell heights) with its rows' heights from the cell edges the setup resolved (`zEdges` of the provenance) and its
 * rows' listed elevations for the boundary sides; null for a mesh's points.
 * @throws InvalidInput (422) for a rectilinear recipe without its cell edges
 */
function labelledGrid(recipe: Recipe, zEdges: number[] | undefined): { counts: WeakZoneGrid['counts']; spacing: WeakZoneGrid['spacing']; heights?: number[]; definition: GridDefinition } | null {
	const t = recipe.targets;
	if (t.kind === 'grid') return { counts: t.counts, spacing: t.spacing, definition: { origin: t.origin, spacing: t.spacing, counts: t.counts } };
	if (t.kind !== 'rectilinear') return null;
	const step = (a: number[]) => (a.length > 1 ? a[1] - a[0] : 1);
	const counts = { x: t.x.length, y: t.y.length, z: t.z.length };
	if (!zEdges || zEdges.length !== t.z.length + 1) {
		throw new InvalidInput('This recipe does not record its cells’ heights, which the zones’ areas need.', [{ path: [], message: 'No cell edges.' }]);
	}
	const heights = t.z.map((_, k) => zEdges[k + 1] - zEdges[k]);
	const spacing = { x: step(t.x), y: step(t.y), z: NaN };
	return { counts, spacing, heights, definition: { origin: { x: t.x[0], y: t.y[0], z: t.z[0] }, spacing, counts, z: t.z } };
}
