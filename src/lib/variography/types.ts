/**
 * Plain-data shapes of the variography workspace: what the domain-samples endpoint returns, the experimental
 * settings a user picks, and the results the worker hands back. Everything here survives structured clone.
 */
import type { LagBin, StructureType } from '../geostat';

/** The body of GET /api/v1/projects/[id]/domains/[did]/samples (the stratigraphy stage's contract). */
export interface DomainSamplesData {
	domain: {
		id: string;
		name: string;
		zonationId: string;
		zonationName: string;
		property: string;
		cellHeight: number | null;
		averaging: string;
		declusterCell: { x: number; y: number; z: number } | null;
	};
	property: { key: string; label: string; unit: string };
	lengthUnit: 'm' | 'ft';
	geometry: '2d' | '3d';
	/** Columns; in 2D x is the chainage and y is 0. */
	samples: { x: number[]; y: number[]; z: number[]; value: number[]; sounding: string[] };
	/** Declustering weights summing to 1. */
	weights: number[];
	stats: { n: number; mean: number; sd: number; p10: number; p50: number; p90: number };
}

/** Lag settings of one direction. */
export interface LagSettings {
	lag: number;
	nLags: number;
	lagTolerance: number;
}

/** Everything that decides an experimental variogram pair; saved beside a fitted model. */
export interface VariogramSettings {
	/** Raw values of the property, or their normal scores. */
	transform: 'raw' | 'normal';
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
	type: Exclude<StructureType, 'nugget'>;
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
