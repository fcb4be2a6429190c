/**
 * The demo's simulations: a recipe of sequential Gaussian simulation for each of the demo's zonations on one
 * section grid with one seed and 20 realizations, every domain with its saved variogram (demo-variograms.ts), so
 * a newcomer opens Simulations and sees a realization within seconds; and beside them a uniform baseline of the
 * strata (the grouped zonation) at the declustered P50, with P33 and P67 for a sensitivity study.
 */
import type { DbOrTx } from '$lib/server/db/transaction';
import { createRecipe } from './recipes';
import { listZonations } from './zonations';

/** The demo grid: the 400 m section at 1 m × 0.2 m (the domains' averaging height) from −12 m to +5 m. */
export const DEMO_GRID = { geometry: '2d', chainage: { from: 0, to: 400, cell: 1 }, elevation: { from: -12, to: 5, cell: 0.2 } } as const;
export const DEMO_SEED = '20250417';
export const DEMO_REALIZATIONS = 20;

/** The demo's uniform baseline: the declustered P33, P50 and P67 of each stratum, one realization each. */
export const DEMO_PERCENTILES = [33, 50, 67];
export const DEMO_BASELINE_ZONATION = 'Sand grouped';

/**
 * The demo's recipes: first the uniform baseline of the grouped zonation (every domain included), then one of
 * sequential Gaussian simulation for each zonation with every domain simulated with its newest variogram and the
 * default settings. Returns their ids in that order.
 */
export function seedDemoRecipes(db: DbOrTx, projectId: string, userId: string): string[] {
	const grouped = listZonations(projectId, db).find((z) => z.name === DEMO_BASELINE_ZONATION)!;
	const baseline = createRecipe(
		projectId,
		userId,
		{
			kind: 'uniform',
			name: 'Uniform baseline, P50 (P33 and P67 for sensitivity)',
			zonationId: grouped.id,
			percentiles: DEMO_PERCENTILES,
			grid: DEMO_GRID,
			domains: grouped.domains.map((d) => ({ domainId: d.id, simulate: true }))
		},
		db
	).recipe.id;
	// The split zonation last, so it is the newest recipe and the one the page opens first.
	const stochastic = [...listZonations(projectId, db)].reverse().map(
		(z) =>
			createRecipe(
				projectId,
				userId,
				{
					kind: 'sgs',
					name: `${z.name}, ${DEMO_REALIZATIONS} realizations`,
					zonationId: z.id,
					seed: DEMO_SEED,
					realizations: DEMO_REALIZATIONS,
					grid: DEMO_GRID,
					domains: z.domains.map((d) => ({
						domainId: d.id,
						simulate: true,
						variogramId: null,
						kriging: 'simple',
						search: { maxData: 16, maxSimulated: 16, maxPerSounding: 8, path: 'random', radius: null },
						tails: { zmin: null, zmax: null }
					}))
				},
				db
			).recipe.id
	);
	return [baseline, ...stochastic];
}
