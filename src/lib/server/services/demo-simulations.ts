/**
 * The demo's simulations: a recipe for each of the demo's zonations on one section grid with one seed and 20
 * realizations, every domain with its saved variogram (demo-variograms.ts), so a newcomer opens Simulations and
 * sees a realization within seconds.
 */
import type { DbOrTx } from '$lib/server/db/transaction';
import { createRecipe } from './recipes';
import { listZonations } from './zonations';

/** The demo grid: the 400 m section at 1 m × 0.2 m (the domains' averaging height) from −12 m to +5 m. */
export const DEMO_GRID = { geometry: '2d', chainage: { from: 0, to: 400, cell: 1 }, elevation: { from: -12, to: 5, cell: 0.2 } } as const;
export const DEMO_SEED = '20250417';
export const DEMO_REALIZATIONS = 20;

/** A recipe for each demo zonation: every domain simulated with its newest variogram and the default settings. */
export function seedDemoRecipes(db: DbOrTx, projectId: string, userId: string): string[] {
	// The split zonation last, so it is the newest recipe and the one the page opens first.
	return [...listZonations(projectId, db)].reverse().map(
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
}
