/**
 * Plain-data shapes of the variography workspace: what the domain-samples endpoint returns, the experimental
 * settings a user picks, and the results the worker hands back. Everything here survives structured clone.
 */
import type { DomainInput, LagBin, StructureType } from '../geostat';
import type { SimulatedProperty } from '../properties';
import type { DomainSamples } from '../server/services/domains';

/**
 * What the workspace computes on: a domain's sample columns (in 2D x is the chainage and y is 0), its
 * declustering weights summing to 1 and the length unit, as GET …/domains/[did]/samples returns them.
 */
export type DomainSamplesData = Pick<DomainSamples, 'samples' | 'weights' | 'lengthUnit'>;

/** Lag settings of one direction. */
export interface LagSettings {
	lag: number;
	nLags: number;
	lagTolerance: number;
}

/** Everything that decides an experimental variogram pair; saved beside a fitted model. */
export interface VariogramSettings {
	/** The engine's names: the normal scores of the property ('normal-score'), or its values ('none'). */
	transform: DomainInput['transform'];
	/** Use the domain's declustering weights for the normal-score transform and the variance line. */
	declustered: boolean;
	vertical: LagSettings;
	horizontal: LagSettings & {
		/** Largest |dz| of a horizontal pair. */
		verticalBand: number;
		/** 3D only: plan direction in degrees clockwise from north; null for omnidirectional. */
		azimuth: number | null;
		/** Half-angle around the azimuth, degrees. */
		angleTolerance: number;
	};
	/** Bins with fewer pairs are left out of fits and misfits. */
	minPairs: number;
}

/** How the automatic fit was asked for: the structure, and the nugget fitted, left out or held at a value. */
export interface FitRequest {
	type: Exclude<StructureType, 'nugget'>;
	nugget: 'fit' | 'none' | number;
}

/** The settings saved beside a fitted model: the experimental settings, the fit request and the data's context. */
export interface SavedVariogramSettings extends VariogramSettings {
	fit?: FitRequest;
	/** The property the domain was analysed in. */
	property?: SimulatedProperty;
	/** Number of samples the variograms were computed on. */
	samples?: number;
}

/** The experimental variograms of a domain, with the reference variance of the analysed values. */
export interface ExperimentalResult {
	vertical: LagBin[];
	horizontal: LagBin[];
	/** Variance of the analysed values (weighted when declustered): the line the sill is read against. */
	variance: number;
	mean: number;
	n: number;
	soundings: number;
}

/** The numbers a user edits: one structure plus a nugget, isotropic in plan. */
export interface ModelParameters {
	type: FitRequest['type'];
	nugget: number;
	/** Total sill: nugget + structure. */
	sill: number;
	rangeVertical: number;
	rangeHorizontal: number;
	azimuth: number;
}

/** A weighted misfit (Σ N/γ̂² (γ̂ − γ)²) over the bins used, and per bin. */
export interface Misfit {
	wss: number;
	bins: number;
	perBin: number;
}

/** Misfit of a model overall and by direction (null where a direction has no usable bin). */
export interface ModelMisfit {
	total: Misfit | null;
	vertical: Misfit | null;
	horizontal: Misfit | null;
}

/** How the horizontal bins' misfit changes with the horizontal range, everything else fixed. */
export interface RangeSensitivity {
	range: number;
	base: Misfit;
	halved: Misfit;
	doubled: Misfit;
	/** Misfit per bin against horizontal range, log-spaced. */
	curve: { range: number; perBin: number }[];
}

/** Progress of a chunked computation. */
export interface Progress {
	done: number;
	total: number;
	stage: string;
}
