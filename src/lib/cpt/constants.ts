/**
 * Physical constants, exact unit factors and limits shared by the CPT correlations and parsers.
 * Everything in src/lib/cpt works in SI: lengths in m, stresses in kPa, unit weights in kN/m³.
 */

/** Atmospheric pressure pa in kPa, the reference stress of the normalisations (Robertson 2009; Boulanger & Idriss 2014). */
export const PA_KPA = 101.325;

/** Unit weight of water γw in kN/m³ used for hydrostatic pore pressure u0 (common practice). */
export const GAMMA_W = 9.81;

/** Cone net area ratio assumed when a file does not state one (common practice for 10 cm² and 15 cm² cones). */
export const DEFAULT_AREA_RATIO = 0.8;

/** Cone factor Nkt for su = (qt − σv)/Nkt when a unit gives none; Lunne et al. (1997) report 10–20. */
export const DEFAULT_NKT = 14;

/** Largest accepted upload per file: 50 MB taken as 50 × 2²⁰ = 52 428 800 bytes. */
export const MAX_FILE_BYTES = 50 * 1024 * 1024;

/**
 * Ic range treated as "on the chart". Robertson's (2009) SBTn chart spans soil behaviour from gravelly
 * sand (Ic below about 1.31) to organic soil (above about 3.6); readings outside about 1.0–4.0 are flagged
 * as off the chart (common practice).
 */
export const IC_CHART_MIN = 1.0;
/** Upper end of the Ic chart range; see {@link IC_CHART_MIN}. */
export const IC_CHART_MAX = 4.0;

/**
 * qc1Ncs range inside the stress exponent m = 1.338 − 0.249·qc1Ncs^0.264 of Boulanger & Idriss (2014).
 * It matches Dr = 0 … 1 of Idriss & Boulanger (2008) with Cdq = 0.9.
 */
export const QC1NCS_MIN = 21;
/** Upper qc1Ncs limit inside m; see {@link QC1NCS_MIN}. */
export const QC1NCS_MAX = 254;

/** Cap on the overburden correction factor CN (Boulanger & Idriss 2014). */
export const CN_MAX = 1.7;

/** One international foot in metres, exact by definition (international yard and pound agreement, 1959). */
export const FT_TO_M = 0.3048;

/**
 * One short ton-force per square foot in kPa: 2000 lbf / ft², with 1 lb = 0.45359237 kg (exact, 1959),
 * standard gravity gn = 9.80665 m/s² (exact, 3rd CGPM 1901) and 1 ft = 0.3048 m (exact) — the definitions
 * collected in NIST Special Publication 811. Evaluates to 95.760 517 96… kPa.
 */
export const TSF_TO_KPA = (2000 * 0.45359237 * 9.80665) / (FT_TO_M * FT_TO_M) / 1000;
