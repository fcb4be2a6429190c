import type { LagBin, VariogramMap } from '$lib/geostat';
import type {
	AutoFitBins,
	AutoFitOptions,
	DomainSamplesData,
	ExperimentalResult,
	MapAnisotropy,
	ModelMisfit,
	ModelParameters,
	Progress,
	RangeSensitivity,
	VariogramSettings
} from '$lib/variography';

/** Misfit and range sensitivity of a model against the bins, per direction (null where a direction has no usable bin). */
export interface Evaluation {
	misfit: ModelMisfit;
	sensitivity: { vertical: RangeSensitivity | null; horizontal: RangeSensitivity | null; minor: RangeSensitivity | null };
}

/** The bins a model is evaluated against. */
export interface EvaluationBins {
	vertical: LagBin[];
	horizontal: LagBin[];
	horizontalMinor: LagBin[] | null;
}

/**
 * The computations the workspace asks for, off the page's thread: the browser's worker (VariographyWorker),
 * or the same functions called in process in tests.
 */
export interface VariographyEngine {
	/** The experimental variograms (and a 3D domain's map); a job still running is cancelled first. Rejects with a CancelledError when cancelled. */
	variograms(
		data: Pick<DomainSamplesData, 'samples' | 'weights' | 'geometry'>,
		settings: VariogramSettings,
		onProgress: (p: Progress) => void
	): Promise<ExperimentalResult>;
	/** Cancels the running variogram job, if any. */
	cancel(): void;
	fit(bins: AutoFitBins, opts: AutoFitOptions): Promise<{ parameters: ModelParameters }>;
	evaluate(parameters: ModelParameters, bins: EvaluationBins, minPairs: number): Promise<Evaluation>;
	anisotropy(map: VariogramMap, parameters: Pick<ModelParameters, 'type' | 'nugget' | 'sill'>, minPairs: number): Promise<MapAnisotropy>;
	terminate(): void;
}
