import { FT_TO_M, TSF_TO_KPA } from './constants';

/** Stress units the parsers accept, with their factor to kPa. Exact by definition. */
const STRESS: Record<string, number> = {
	kpa: 1,
	'kn/m2': 1,
	mpa: 1000,
	'mn/m2': 1000,
	'n/mm2': 1000,
	pa: 0.001,
	'n/m2': 0.001,
	bar: 100,
	tsf: TSF_TO_KPA
};

/** Length units the parsers accept, with their factor to metres. Exact by definition. */
const LENGTH: Record<string, number> = { m: 1, cm: 0.01, mm: 0.001, ft: FT_TO_M };

/** Case, spaces and the spellings m², m^2 of a unit label do not matter; "mpa" in a CPT file means MPa. */
function normaliseUnit(unit: string): string {
	return unit.trim().toLowerCase().replace(/\s+/g, '').replace(/²/g, '2').replace(/\^2/g, '2');
}

/**
 * Factor converting a stress in `unit` to kPa (MPa, kPa, Pa, MN/m2, kN/m2, N/mm2, bar, tsf — case-insensitive),
 * or undefined for a unit it does not know.
 */
export function stressUnitFactor(unit: string): number | undefined {
	return STRESS[normaliseUnit(unit)];
}

/** Factor converting a length in `unit` to metres (m, cm, mm, ft), or undefined for a unit it does not know. */
export function lengthUnitFactor(unit: string): number | undefined {
	return LENGTH[normaliseUnit(unit)];
}
