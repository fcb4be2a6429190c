import type { FitInput, LagBin } from '$lib/geostat';
import type {
	AutoFitOptions,
	DomainSamplesData,
	ExperimentalResult,
	ModelMisfit,
	ModelParameters,
	Progress,
	RangeSensitivity,
	VariogramSettings
} from '$lib/variography';

/** Misfit and horizontal range sensitivity of a model against the bins. */
export interface Evaluation {
	misfit: ModelMisfit;
	sensitivity: RangeSensitivity | null;
}

/**
 * The computations the workspace asks for, off the page's thread: the browser's worker (VariographyWorker),
 * or the same functions called in process in tests.
 */
export interface VariographyEngine {
	/** Both experimental variograms; a job still running is cancelled first. Rejects with a CancelledError when cancelled. */
	variograms(data: Pick<DomainSamplesData, 'samples' | 'weights'>, settings: VariogramSettings, onProgress: (p: Progress) => void): Promise<ExperimentalResult>;
	/** Cancels the running variogram job, if any. */
	cancel(): void;
	fit(bins: FitInput, opts: AutoFitOptions): Promise<{ parameters: ModelParameters }>;
	evaluate(parameters: ModelParameters, bins: { vertical: LagBin[]; horizontal: LagBin[] }, minPairs: number): Promise<Evaluation>;
	terminate(): void;
}
