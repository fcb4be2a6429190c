/**
 * Module Web Worker for the variography workspace: experimental variograms, normal scores with declustering
 * weights, automatic fit, misfit and range sensitivity, exposed through comlink. The computations live in
 * src/lib/variography (pure, tested in Node); this file only adds job bookkeeping and cancellation.
 *
 * Cancellation: each variogram job has an id; cancel(id) marks it, and the chunked computation checks the mark
 * between chunks (it awaits a macrotask after each chunk, so the cancel message is delivered in time).
 */
import * as Comlink from 'comlink';
import {
	autoFit,
	computeVariograms,
	mapAnisotropy,
	modelFromParameters,
	modelMisfit,
	prepareSamples,
	rangeSensitivity,
	type AutoFitBins,
	type AutoFitOptions,
	type DomainSamplesData,
	type ExperimentalResult,
	type ModelParameters,
	type Progress,
	type VariogramSettings
} from '../src/lib/variography';
import type { LagBin, VariogramMap } from '../src/lib/geostat';

const cancelled = new Set<number>();

export const variographyApi = {
	/**
	 * The experimental variograms of a domain's samples under the settings (and the map in plan for a 3D
	 * domain); progress after each chunk.
	 */
	async variograms(
		job: number,
		data: Pick<DomainSamplesData, 'samples' | 'weights' | 'geometry'>,
		settings: VariogramSettings,
		onProgress?: (p: Progress) => void
	): Promise<ExperimentalResult> {
		try {
			const prepared = prepareSamples(data, settings);
			return await computeVariograms(prepared, settings, { onProgress, isCancelled: () => cancelled.has(job), map: data.geometry === '3d' });
		} finally {
			cancelled.delete(job);
		}
	},
	/** Stops job `job` at its next chunk boundary (it then rejects with a CancelledError). */
	cancel(job: number): void {
		cancelled.add(job);
	},
	fit(bins: AutoFitBins, opts: AutoFitOptions) {
		return autoFit(bins, opts);
	},
	/** Misfit of edited parameters and each direction's range sensitivity, in one round trip. */
	evaluate(parameters: ModelParameters, bins: { vertical: LagBin[]; horizontal: LagBin[]; horizontalMinor: LagBin[] | null }, minPairs: number) {
		const model = modelFromParameters(parameters);
		const minor = bins.horizontalMinor;
		return {
			model,
			misfit: modelMisfit(model, bins, minPairs),
			sensitivity: {
				vertical: rangeSensitivity(model, bins.vertical, { direction: 'vertical', minPairs }),
				horizontal: rangeSensitivity(model, bins.horizontal, { direction: minor ? 'major' : 'horizontal', minPairs }),
				minor: minor ? rangeSensitivity(model, minor, { direction: 'minor', minPairs }) : null
			}
		};
	},
	/** The direction of greatest continuity read off the map, with the structure, nugget and sill held. */
	anisotropy(map: VariogramMap, parameters: Pick<ModelParameters, 'type' | 'nugget' | 'sill'>, minPairs: number) {
		return mapAnisotropy(map, parameters, minPairs);
	}
};

export type VariographyApi = typeof variographyApi;

// Only expose when running as a worker; importing the module elsewhere (type checks, tests) has no side effect.
if (typeof self !== 'undefined' && typeof (self as { postMessage?: unknown }).postMessage === 'function' && typeof window === 'undefined') {
	Comlink.expose(variographyApi);
}
