/**
 * Per-reading quality flags, a bitmask. Out-of-range results are flagged and kept as computed, never clamped
 * (the 0–100 % limits of the fines-content relation are part of that method and are not a flag).
 */
export const CptFlag = {
	/** qc or fs is missing (NaN) at this reading. */
	missingReading: 1 << 0,
	/** u2 was not measured here, so qt = qc. */
	qtFromQc: 1 << 1,
	/** Net resistance qt − σv ≤ 0: Qtn, Fr, Ic and su are not meaningful. */
	negativeNetResistance: 1 << 2,
	/** fs ≤ 0: Fr has no logarithm, so Ic is undefined. */
	nonPositiveFriction: 1 << 3,
	/** σ'v ≤ 0 (e.g. a reading at the ground surface): the stress normalisations are undefined. */
	nonPositiveStress: 1 << 4,
	/** Ic outside the chart range IC_CHART_MIN–IC_CHART_MAX (common practice). */
	icOutOfChart: 1 << 5,
	/** An iteration (Robertson 2009 n, or Boulanger & Idriss 2014 CN) did not converge. */
	notConverged: 1 << 6,
	/** qc1Ncs outside 21–254, the range Boulanger & Idriss (2014) allow inside m. */
	qc1NcsOutOfRange: 1 << 7,
	/** Relative density outside 0–1. */
	drOutOfRange: 1 << 8,
	/** The reading lies above the groundwater table (u0 = 0, no suction assumed). */
	aboveWaterTable: 1 << 9,
	/** The reading lies above the top of the first stratigraphic unit; that unit's properties are used. */
	aboveFirstUnit: 1 << 10,
	/** FC comes from a measured value rather than from Ic. */
	measuredFinesContent: 1 << 11,
	/** A measured FC outside 0–100 % was ignored and FC taken from Ic instead. */
	measuredFinesContentInvalid: 1 << 12
} as const;

/** The name of one flag. */
export type CptFlagName = keyof typeof CptFlag;

/** The names of the flags set in `mask`, in bit order. */
export function describeFlags(mask: number): CptFlagName[] {
	const names: CptFlagName[] = [];
	for (const name of Object.keys(CptFlag) as CptFlagName[]) if (mask & CptFlag[name]) names.push(name);
	return names;
}
