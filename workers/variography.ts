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
	modelFromParameters,
	modelMisfit,
	prepareSamples,
	rangeSensitivity,
	type AutoFitOptions,
	type DomainSamplesData,
	type ExperimentalResult,
	type ModelParameters,
	type Progress,
	type VariogramSettings
} from '../src/lib/variography';
import type { FitInput, LagBin } from '../src/lib/geostat';

const cancelled = new Set<number>();

export const variographyApi = {
	/** Both experimental variograms of a domain's samples under the settings; progress after each chunk. */
	async variograms(
		job: number,
		data: Pick<DomainSamplesData, 'samples' | 'weights'>,
		settings: VariogramSettings,
		onProgress?: (p: Progress) => void
	): Promise<ExperimentalResult> {
		try {
			const prepared = prepareSamples(data, settings);
			return await computeVariograms(prepared, settings, { onProgress, isCancelled: () => cancelled.has(job) });
		} finally {
			cancelled.delete(job);
		}
	},
	/** Stops job `job` at its next chunk boundary (it then rejects with a CancelledError). */
	cancel(job: number): void {
		cancelled.add(job);
	},
	fit(bins: FitInput, opts: AutoFitOptions) {
		return autoFit(bins, opts);
	},
	/** Misfit of edited parameters and the horizontal range sensitivity, in one round trip. */
	evaluate(parameters: ModelParameters, bins: { vertical: LagBin[]; horizontal: LagBin[] }, minPairs: number) {
		const model = modelFromParameters(parameters);
		return {
			model,
			misfit: modelMisfit(model, bins, minPairs),
			sensitivity: rangeSensitivity(model, bins.horizontal, { minPairs })
		};
	}
};

export type VariographyApi = typeof variographyApi;

// Only expose when running as a worker; importing the module elsewhere (type checks, tests) has no side effect.
if (typeof self !== 'undefined' && typeof (self as { postMessage?: unknown }).postMessage === 'function' && typeof window === 'undefined') {
	Comlink.expose(variographyApi);
}
