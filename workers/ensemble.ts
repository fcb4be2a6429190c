/**
 * Module Web Worker for the Simulations page: ensemble maps and checks of the realizations the page holds,
 * off the page's thread. The computations are src/lib/ensemble (pure, tested in Node); ensemble maps are the
 * same function the server's summary endpoint runs, so a map here has the endpoint's bits.
 */
import * as Comlink from 'comlink';
import { checkRealizations, ensembleMap, type CheckOptions, type EnsembleStat } from '../src/lib/ensemble/index';
import type { Recipe } from '../src/lib/geostat/index';

export const ensembleApi = {
	ensembleMap(realizations: Float64Array[], stat: EnsembleStat, threshold?: number): Float64Array {
		const out = ensembleMap(realizations, stat, threshold);
		return Comlink.transfer(out, [out.buffer]);
	},
	checks(recipe: Recipe, realizations: Float64Array[], opts?: CheckOptions) {
		return checkRealizations(recipe, realizations, opts);
	}
};

export type EnsembleApi = typeof ensembleApi;

// Only expose when running as a worker; importing the module elsewhere (type checks, tests) has no side effect.
if (typeof self !== 'undefined' && typeof (self as { postMessage?: unknown }).postMessage === 'function' && typeof window === 'undefined') {
	Comlink.expose(ensembleApi);
}
