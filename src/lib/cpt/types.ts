/**
 * Shapes shared by the CPT parsers, writers and the derived-property pipeline.
 * All values are SI: depth and coordinates in m, stresses in kPa. Missing or void readings are NaN.
 */

/** One sounding as read from a file. Parsers always return Float64Array columns of equal length. */
export interface ParsedSounding {
	id: string;
	/** Easting. */
	x?: number;
	/** Northing. */
	y?: number;
	/** Distance along a section line, when a file gives it instead of easting/northing. */
	chainage?: number;
	/** Ground elevation at the sounding (depth 0). */
	groundElevation?: number;
	/** Cone net area ratio a of qt = qc + u2(1 − a). */
	areaRatio?: number;
	/** Depth below ground, non-negative and strictly increasing (the parsers reject anything else). */
	depth: Float64Array;
	/** Cone resistance qc. */
	qc: Float64Array;
	/** Sleeve friction fs. */
	fs: Float64Array;
	/** Pore pressure behind the cone, u2; absent when the file has no such column. */
	u2?: Float64Array;
	/** Further numeric columns by name, as they stand in the file (no unit conversion). */
	extra?: Record<string, Float64Array>;
	/** Free-text header facts worth keeping (GEF keywords, AGS project id …). */
	meta?: Record<string, string>;
	/** How the parser read something unusual but readable (a sign convention, a fallback), for the import summary. */
	notes?: string[];
}

/** The readings the derived-property pipeline needs: ParsedSounding or any array-like columns. */
export interface CptReadings {
	depth: ArrayLike<number>;
	qc: ArrayLike<number>;
	fs: ArrayLike<number>;
	u2?: ArrayLike<number>;
	groundElevation?: number;
	areaRatio?: number;
}

/** Options common to the parsers. */
export interface ParseOptions {
	/** File name, used in error messages and as the sounding id when the file names none. */
	file?: string;
}
