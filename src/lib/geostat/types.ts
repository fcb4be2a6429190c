/**
 * Shared shapes of the geostatistics engine.
 *
 * Coordinates are in the project's length unit. x and y are horizontal (x east, y north); z is elevation,
 * positive up, so a depth below ground converts to z = ground elevation − depth.
 */

/** One datum: a location, its value, and optionally the sounding it was measured in. */
export interface Sample {
	x: number;
	y: number;
	z: number;
	value: number;
	/** Sounding identifier; vertical variograms pair samples of one sounding only. */
	sounding?: string;
}

/** Variogram structure families, in practical-range form (Deutsch & Journel 1998). */
export type StructureType = 'nugget' | 'spherical' | 'exponential' | 'gaussian';

/**
 * One nested structure. Ranges are practical ranges along the major horizontal axis, the minor horizontal
 * axis and the vertical; a nugget ignores its ranges.
 */
export interface Structure {
	type: StructureType;
	sill: number;
	rangeMajor: number;
	rangeMinor: number;
	rangeVertical: number;
}

/**
 * A variogram model: a sum of nested structures sharing one plan orientation.
 * `azimuth` is the major horizontal axis in degrees clockwise from +y (north).
 */
export interface VariogramModel {
	structures: Structure[];
	azimuth: number;
}

/** One bin of an experimental variogram. `h` is the mean separation of the bin's pairs. */
export interface LagBin {
	h: number;
	gamma: number;
	pairs: number;
}

/** A plan direction with its angular tolerance and bandwidth, for horizontal variograms. */
export interface ExperimentalOptions {
	/** 'vertical', 'horizontal', or a 3D direction (azimuth clockwise from +y, dip positive downward), in degrees. */
	direction: 'vertical' | 'horizontal' | { azimuth: number; dip: number };
	/** Lag spacing (> 0). */
	lag: number;
	/** Number of lag bins (positive integer). */
	nLags: number;
	/** Half-width of each bin; default lag / 2. */
	lagTolerance?: number;
	/** Horizontal only: largest |dz| of a pair; default 0.1. */
	verticalBand?: number;
	/** Horizontal only: plan direction in degrees clockwise from +y; omit for an omnidirectional variogram. */
	azimuth?: number;
	/** Half-angle in degrees around the direction (horizontal with azimuth, and 3D); default 22.5. */
	angleTolerance?: number;
	/** Largest perpendicular offset in plan from the direction line (horizontal with azimuth, and 3D); default Infinity. */
	bandwidth?: number;
	/** 3D only: largest offset from the direction line within its vertical plane; default Infinity. */
	verticalBandwidth?: number;
}

/**
 * The normal-score transform table: distinct data values in ascending order with their normal scores
 * (strictly increasing), the tail bounds and the tail rule used by backTransform.
 */
export interface NormalScoreTable {
	values: Float64Array;
	scores: Float64Array;
	/** Value returned at and below the lower tail anchor (linear tail). */
	zmin: number;
	/** Value returned at and above the upper tail anchor (linear tail). */
	zmax: number;
	tail: 'linear' | 'clamp';
}

/** Options of fitVariogram. */
export interface FitOptions {
	type: 'spherical' | 'exponential' | 'gaussian';
	/** A fixed nugget, 'fit' to estimate it, or omitted for no nugget. */
	nugget?: number | 'fit';
	/** A fixed total sill (nugget + structure), or 'fit' (default). */
	sill?: number | 'fit';
	/** Bins with fewer pairs are left out; default 30. */
	minPairs?: number;
	/**
	 * Plan azimuth (degrees clockwise from +y) the `horizontal` bins were computed along: the fitted model's
	 * major axis; `horizontalMinor` bins lie across it. Default 0.
	 */
	azimuth?: number;
}

/**
 * Bins of experimental variograms, for fitting: vertical, horizontal (omnidirectional, or along the model's
 * major axis), and optionally horizontal across it (the minor axis, azimuth + 90°).
 */
export interface FitInput {
	vertical?: LagBin[];
	horizontal?: LagBin[];
	horizontalMinor?: LagBin[];
}
