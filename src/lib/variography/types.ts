/**
 * Plain-data shapes of the variography workspace: what the domain-samples endpoint returns, the experimental
 * settings a user picks, and the results the worker hands back. Everything here survives structured clone.
 */
import type { DomainInput, LagBin, LinearTrendFit, StructureType, VariogramMap } from '../geostat';
import type { SimulatedProperty } from '../properties';
import type { DomainSamples } from '../server/services/domains';

/**
 * What the workspace computes on: a domain's sample columns (in 2D x is the chainage and y is 0), its
 * declustering weights summing to 1, the length unit and (optionally) the geometry, as
 * GET …/domains/[did]/samples returns them. A '3d' geometry adds the variogram map in plan.
 */
export type DomainSamplesData = Pick<DomainSamples, 'samples' | 'weights' | 'lengthUnit'> & Partial<Pick<DomainSamples, 'geometry'>>;

/** What is analysed besides the transform: the values themselves, or their residuals from a linear trend. */
export type TrendChoice = 'none' | 'elevation' | 'elevation-plan';

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
	/** Use the domain's declustering weights for the trend, the normal-score transform and the variance line. */
	declustered: boolean;
	/**
	 * A linear trend of the mean removed before the transform (fitted by weighted least squares): with
	 * elevation, or with elevation and the plan coordinates (the chainage of a 2D section). Saved versions
	 * without it read as 'none'.
	 */
	trend: TrendChoice;
	vertical: LagSettings;
	horizontal: LagSettings & {
		/** Largest |dz| of a horizontal pair. */
		verticalBand: number;
		/**
		 * 3D only: plan direction in degrees clockwise from north, null for omnidirectional. With a direction
		 * the horizontal variogram runs along it (the model's major axis) and a second one across it (minor).
		 */
		azimuth: number | null;
		/** Half-angle around the azimuth, degrees. */
		angleTolerance: number;
	};
	/** Bins with fewer pairs are left out of fits and misfits. */
	minPairs: number;
}

/**
 * How the automatic fit was asked for: the structure, the nugget fitted, left out or held at a value, and the
 * total sill held at the variance of what is analysed ('variance', the default) or fitted freely ('fit';
 * versions saved before the choice existed were fitted freely).
 */
export interface FitRequest {
	type: Exclude<StructureType, 'nugget'>;
	nugget: 'fit' | 'none' | number;
	sill?: 'variance' | 'fit';
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
	/** Omnidirectional, or along the settings' azimuth (the major axis). */
	horizontal: LagBin[];
	/** Across the azimuth (azimuth + 90°) when the settings give one; else null. */
	horizontalMinor: LagBin[] | null;
	/** γ over plan offsets (3D only; else null). */
	map: VariogramMap | null;
	/** Variance of the analysed values (weighted when declustered): the line the sill is read against. */
	variance: number;
	mean: number;
	n: number;
	soundings: number;
	/** The trend removed before the transform, with its fit statistics; null without one. */
	trend: LinearTrendFit | null;
	/** How each direction's experimental plateau compares with the variance. */
	plateau: PlateauCheck;
}

/** One direction's experimental plateau: the pair-weighted mean γ̂ of the outer third of its usable lags. */
export interface Plateau {
	/** The plateau γ̂ and its ratio to the variance of what is analysed. */
	gamma: number;
	ratio: number;
	/** Usable bins (at least minPairs pairs) it averages, their pairs, and the separations they span. */
	bins: number;
	pairs: number;
	from: number;
	to: number;
}

/** The plateaus of every direction (null where a direction has too few usable bins) and the plain warning. */
export interface PlateauCheck {
	vertical: Plateau | null;
	horizontal: Plateau | null;
	minor: Plateau | null;
	/** Departures beyond the tolerance, worded for the page; empty when every plateau is near the variance. */
	departures: string[];
	/** Likely causes and what to do; null when there is no departure. */
	advice: string | null;
}

/**
 * The numbers a user edits: one structure plus a nugget, with a vertical range and two plan ranges along
 * and across `azimuth` (a 2D section and an omnidirectional fit keep rangeMinor = rangeMajor).
 */
export interface ModelParameters {
	type: FitRequest['type'];
	nugget: number;
	/** Total sill: nugget + structure. */
	sill: number;
	rangeVertical: number;
	rangeMajor: number;
	rangeMinor: number;
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
	minor: Misfit | null;
}

/** How one direction's misfit changes with its range, everything else fixed. */
export interface RangeSensitivity {
	direction: 'vertical' | 'horizontal' | 'major' | 'minor';
	range: number;
	base: Misfit;
	halved: Misfit;
	doubled: Misfit;
	/** Misfit per bin against the range, log-spaced. */
	curve: { range: number; perBin: number }[];
	/**
	 * The ranges the data admit: the interval around the model's range within which the misfit per bin stays
	 * below `limit`. An end at the scan's edge (⅛ or 8 times the range) is open (lowOpen / highOpen).
	 */
	admitted: { low: number; high: number; lowOpen: boolean; highOpen: boolean; limit: number };
}

/** Progress of a chunked computation. */
export interface Progress {
	done: number;
	total: number;
	stage: string;
}
