import { autoFit, computeVariograms, defaultSettings, prepareSamples, type SavedVariogramSettings } from '$lib/variography';
import type { VariogramModel } from '$lib/geostat';
import type { DbOrTx } from '$lib/server/db/transaction';
import { inTransaction } from '$lib/server/db/transaction';
import { domainSamples } from './domains';
import { saveVariogram } from './variograms';
import { listZonations } from './zonations';

/** The note every demo variogram carries. */
export const DEMO_VARIOGRAM_NOTE =
	'Automatic fit with the default settings when the demo was seeded (normal scores, declustered; exponential with a fitted nugget; total sill held at the variance). Check it before relying on it.';

/**
 * Gives every domain of every zonation of the demo project a saved variogram, version 1 under the domain's
 * name: its default experimental settings (defaultSettings), the variograms computed as the workspace computes
 * them, and the automatic fit with its defaults (exponential, nugget fitted, sill held at the variance of the
 * normal scores). A domain whose plateaus depart from the variance (plateauCheck) gets the warning in its
 * note. Everything is computed first and written in one transaction. Returns the saved models by domain id.
 */
export async function seedDemoVariograms(db: DbOrTx, projectId: string, userId: string): Promise<Map<string, VariogramModel>> {
	const fits: { domainId: string; name: string; model: VariogramModel; settings: SavedVariogramSettings; misfit: number | null; note: string }[] = [];
	for (const z of listZonations(projectId, db)) {
		for (const d of z.domains) {
			const data = domainSamples(projectId, d.id, db);
			if (data.samples.value.length === 0) continue;
			const settings = defaultSettings(data);
			const result = await computeVariograms(prepareSamples(data, settings), settings, { pause: async () => {} });
			const fit = autoFit(result, { type: 'exponential', nugget: 'fit', sill: 'variance', minPairs: settings.minPairs, azimuth: 0, variance: result.variance });
			fits.push({
				domainId: d.id,
				name: d.name,
				model: fit.model,
				settings: { ...settings, fit: { type: 'exponential', nugget: 'fit', sill: 'variance' }, property: d.property, samples: data.samples.value.length },
				misfit: fit.misfit.total?.perBin ?? null,
				// The plateau warning the workspace shows goes into the note, so nobody takes such a model on trust.
				note: result.plateau.departures.length ? `${DEMO_VARIOGRAM_NOTE} Warning: ${result.plateau.departures.join(' ')} ${result.plateau.advice}` : DEMO_VARIOGRAM_NOTE
			});
		}
	}
	inTransaction(db, (tx) => {
		for (const f of fits) saveVariogram(projectId, f.domainId, userId, { name: f.name, model: f.model, settings: f.settings, misfit: f.misfit, note: f.note }, tx);
	});
	return new Map(fits.map((f) => [f.domainId, f.model]));
}
