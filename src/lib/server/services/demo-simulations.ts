/**
 * The demo's simulations: a saved variogram for every demo domain that has none yet, and a recipe for each of the
 * demo's zonations on one section grid with one seed and 20 realizations, so a newcomer opens Simulations and
 * sees a realization within seconds.
 */
import { experimentalVariogram, fitVariogram } from '$lib/geostat';
import type { DbOrTx } from '$lib/server/db/transaction';
import { defaultSettings, modelFromParameters, modelMisfit, parametersFromModel, prepareSamples } from '$lib/variography';
import { domainSamples } from './domains';
import { createRecipe } from './recipes';
import { listVariograms, saveVariogram } from './variograms';
import { listZonations } from './zonations';

/** The demo grid: the 400 m section at 1 m × 0.2 m (the domains' averaging height) from −12 m to +5 m. */
export const DEMO_GRID = { geometry: '2d', chainage: { from: 0, to: 400, cell: 1 }, elevation: { from: -12, to: 5, cell: 0.2 } } as const;
export const DEMO_SEED = '20250417';
export const DEMO_REALIZATIONS = 20;

/**
 * Stand-in until the demo ships variograms of its own (issue 10): for each demo domain without a saved variogram,
 * the variography workspace's default settings (normal scores, declustered), both experimental variograms and the
 * automatic weighted least-squares fit of an exponential structure with a fitted nugget and the sill held at the
 * variance of the normal scores (Cressie 1985 weights; fitVariogram), saved as "Demo automatic fit".
 * Returns the number of variograms saved.
 */
export function seedDemoVariogramsWhereMissing(db: DbOrTx, projectId: string, userId: string): number {
	let saved = 0;
	for (const z of listZonations(projectId, db)) {
		for (const d of z.domains) {
			if (listVariograms(projectId, d.id, db).length > 0) continue;
			const data = domainSamples(projectId, d.id, db);
			if (data.samples.value.length === 0) continue;
			const settings = defaultSettings(data);
			const prepared = prepareSamples(data, settings);
			const { vertical: v, horizontal: h } = settings;
			const bins = {
				vertical: experimentalVariogram(prepared.samples, { direction: 'vertical', lag: v.lag, nLags: v.nLags, lagTolerance: v.lagTolerance }),
				horizontal: experimentalVariogram(prepared.samples, { direction: 'horizontal', lag: h.lag, nLags: h.nLags, lagTolerance: h.lagTolerance, verticalBand: h.verticalBand })
			};
			const fitted = fitVariogram(bins, { type: 'exponential', nugget: 'fit', sill: prepared.variance, minPairs: settings.minPairs });
			const model = modelFromParameters({ ...parametersFromModel(fitted), azimuth: 0 });
			saveVariogram(
				projectId,
				d.id,
				userId,
				{
					name: 'Demo automatic fit',
					model,
					settings: { ...settings, fit: { type: 'exponential', nugget: 'fit' }, property: d.property, samples: data.samples.value.length },
					misfit: modelMisfit(model, bins, settings.minPairs).total?.perBin ?? null,
					note: 'Fitted automatically when the demo was seeded: exponential with a fitted nugget, sill at the variance of the normal scores.'
				},
				db
			);
			saved++;
		}
	}
	return saved;
}

/** A recipe for each demo zonation: every domain simulated with its newest variogram and the default settings. */
export function seedDemoRecipes(db: DbOrTx, projectId: string, userId: string): string[] {
	// The split zonation last, so it is the newest recipe and the one the page opens first.
	return [...listZonations(projectId, db)].reverse().map(
		(z) =>
			createRecipe(
				projectId,
				userId,
				{
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
