/**
 * The property catalogue: every quantity the app lets a user pick, draw or simulate, in one place. The
 * database enum, the zod enums and every select list derive from it (tests/properties.test.ts pins that they
 * agree), so a new property is one entry here.
 *
 * Values are in the units the CPT pipeline returns ($lib/cpt: SI, stresses in kPa, FC in %, Dr as a fraction).
 * `range` is the span a value can plausibly take, for scaling plots and marking suspect readings; values
 * outside it are kept, never clamped. Its `source` names where the bounds come from; "(memory)" marks a bound
 * written from memory of the source or of common practice.
 */
import { IC_CHART_MAX, IC_CHART_MIN, QC1NCS_MAX, QC1NCS_MIN } from './cpt/constants';
import { CptFlag, type CptFlagName } from './cpt/flags';

export interface PropertyInfo {
	/** Key of the derived or measured column (DerivedSounding in $lib/cpt, or qc, fs, u2). */
	key: string;
	/** Short symbol for axes and tables. */
	label: string;
	/** Unit symbol; '–' for dimensionless. */
	unit: string;
	/** Decimals shown in tables and hover read-outs. */
	decimals: number;
	/** What it is, with the published source of its correlation. */
	description: string;
	/** May a stratigraphic unit or domain be simulated in it. */
	simulatable: boolean;
	/** The soils it is usually simulated in, shown beside its name where a unit's property is chosen. */
	suits?: 'sands' | 'clays';
	range: { min: number; max: number; source: string };
	/**
	 * The CPT flags that mark a reading as outside this property's correlation (e.g. qc1Ncs beyond 21–254 for
	 * Boulanger & Idriss 2014): a domain's rules may leave such readings out.
	 */
	flags?: readonly CptFlagName[];
}

/** Every property, simulated ones first in the order select lists show them. */
export const PROPERTIES = [
	{
		key: 'qc1Ncs',
		label: 'qc1Ncs',
		unit: '–',
		decimals: 1,
		description: 'Clean-sand equivalent normalised cone resistance (Boulanger & Idriss 2014)',
		simulatable: true,
		suits: 'sands',
		flags: ['qc1NcsOutOfRange', 'icOutOfChart', 'notConverged'],
		range: { min: QC1NCS_MIN, max: QC1NCS_MAX, source: 'the qc1Ncs limits of the stress exponent m (Boulanger & Idriss 2014)' }
	},
	{
		key: 'suRatio',
		label: 'su/σ′v',
		unit: '–',
		decimals: 3,
		description: 'Undrained strength ratio, su = (qt − σv)/Nkt over σ′v (Lunne et al. 1997)',
		simulatable: true,
		suits: 'clays',
		flags: ['negativeNetResistance', 'nonPositiveStress'],
		range: {
			min: 0,
			max: 1.5,
			source: 'common practice (memory): soft normally consolidated clays 0.2–0.35, overconsolidated crusts up to about 1.5; higher near the surface only because σ′v tends to zero'
		}
	},
	{
		key: 'Ic',
		label: 'Ic',
		unit: '–',
		decimals: 2,
		description: 'Soil behaviour type index (Robertson 2009)',
		simulatable: true,
		flags: ['icOutOfChart', 'notConverged'],
		range: { min: IC_CHART_MIN, max: IC_CHART_MAX, source: 'the span of the SBTn chart (Robertson 2009; common practice)' }
	},
	{
		key: 'qt',
		label: 'qt',
		unit: 'kPa',
		decimals: 0,
		description: 'Corrected cone resistance, qt = qc + u2(1 − a) (Lunne et al. 1997)',
		simulatable: true,
		flags: [],
		range: { min: 0, max: 100_000, source: 'common practice (memory): cones are rated for 50–100 MPa' }
	},
	{
		key: 'FC',
		label: 'FC',
		unit: '%',
		decimals: 1,
		description: 'Fines content, from Ic (Boulanger & Idriss 2014) or measured',
		simulatable: true,
		flags: ['icOutOfChart', 'measuredFinesContentInvalid'],
		range: { min: 0, max: 100, source: 'a percentage; the FC–Ic relation is limited to 0–100 % (Boulanger & Idriss 2014)' }
	},
	{
		key: 'Dr',
		label: 'Dr',
		unit: '–',
		decimals: 2,
		description: 'Relative density as a fraction (Idriss & Boulanger 2008)',
		simulatable: true,
		flags: ['drOutOfRange', 'qc1NcsOutOfRange'],
		range: { min: 0, max: 1, source: 'a fraction; qc1Ncs 21–254 maps to Dr 0–1 with Cdq = 0.9 (Idriss & Boulanger 2008)' }
	},
	{
		key: 'su',
		label: 'su',
		unit: 'kPa',
		decimals: 1,
		description: 'Undrained shear strength, su = (qt − σv)/Nkt (Lunne et al. 1997)',
		simulatable: true,
		flags: ['negativeNetResistance'],
		range: { min: 0, max: 1000, source: 'common practice (memory): very soft clays below 12.5 kPa, hard clays a few hundred kPa' }
	},
	{
		key: 'Qtn',
		label: 'Qtn',
		unit: '–',
		decimals: 1,
		description: 'Normalised cone resistance (Robertson 2009)',
		simulatable: true,
		flags: ['notConverged', 'nonPositiveStress'],
		range: { min: 1, max: 1000, source: 'the Qtn axis of the SBTn chart (Robertson 2009)' }
	},
	{
		key: 'qc',
		label: 'qc',
		unit: 'kPa',
		decimals: 0,
		description: 'Cone resistance, measured',
		simulatable: false,
		range: { min: 0, max: 100_000, source: 'common practice (memory): cones are rated for 50–100 MPa' }
	},
	{
		key: 'fs',
		label: 'fs',
		unit: 'kPa',
		decimals: 1,
		description: 'Sleeve friction, measured',
		simulatable: false,
		range: { min: 0, max: 2000, source: 'common practice (memory): sleeve friction rarely exceeds 1–2 MPa' }
	},
	{
		key: 'u2',
		label: 'u2',
		unit: 'kPa',
		decimals: 1,
		description: 'Pore pressure behind the cone, measured',
		simulatable: false,
		range: {
			min: -101.325,
			max: 10_000,
			source: 'below −1 atm (−101.325 kPa) water cavitates; above, common practice (memory): a few MPa in stiff clays at depth'
		}
	},
	{
		key: 'CRR',
		label: 'CRR',
		unit: '–',
		decimals: 3,
		description: 'Cyclic resistance ratio, M = 7.5, σ′v = 1 atm (Boulanger & Idriss 2014)',
		simulatable: false,
		range: { min: 0, max: 2, source: 'common practice (memory): the relation is meant for qc1Ncs up to about 211, where CRR passes 2' }
	}
] as const satisfies readonly PropertyInfo[];

type Entry = (typeof PROPERTIES)[number];

/** Any property of the catalogue. */
export type PropertyKey = Entry['key'];
/** A property a unit or domain may be simulated in. */
export type SimulatedProperty = Extract<Entry, { simulatable: true }>['key'];

/** The catalogue by key, for look-ups. */
export const PROPERTY_INFO = Object.fromEntries(PROPERTIES.map((p) => [p.key, p])) as Record<PropertyKey, PropertyInfo>;

const isSimulated = (p: Entry): p is Extract<Entry, { simulatable: true }> => p.simulatable;
// Non-empty tuples, the shape z.enum and Drizzle's text enums take.
const keysOf = <K extends PropertyKey>(list: readonly { key: K }[]) => list.map((p) => p.key) as [K, ...K[]];

/** Every key, in catalogue order: the section's traces. */
export const PROPERTY_KEYS = keysOf(PROPERTIES);
/** The simulated keys, in catalogue order: the database enum of units and domains. */
export const SIMULATED_PROPERTIES = keysOf(PROPERTIES.filter(isSimulated));

/** Is `key` a simulated property. */
export function isSimulatedProperty(key: string): key is SimulatedProperty {
	return (SIMULATED_PROPERTIES as readonly string[]).includes(key);
}

/** Plain words for the CPT flags a property's correlation may raise. */
const FLAG_WORDS: Partial<Record<CptFlagName, string>> = {
	qc1NcsOutOfRange: `qc1Ncs outside ${QC1NCS_MIN}–${QC1NCS_MAX}`,
	icOutOfChart: 'Ic off the chart',
	notConverged: 'an iteration that did not converge',
	negativeNetResistance: 'qt − σv ≤ 0',
	nonPositiveStress: 'σ′v ≤ 0',
	drOutOfRange: 'Dr outside 0–1',
	measuredFinesContentInvalid: 'a measured FC outside 0–100 %'
};

/** The flags of a property's correlation in plain words, e.g. "qc1Ncs outside 21–254, Ic off the chart"; '' for none. */
export function correlationFlagText(key: PropertyKey): string {
	return (PROPERTY_INFO[key].flags ?? []).map((f) => FLAG_WORDS[f] ?? f).join(', ');
}

/** The CptFlag bitmask of the flags that mark a reading as outside a property's correlation (0: none). */
export function correlationFlagMask(key: PropertyKey): number {
	let mask = 0;
	for (const name of PROPERTY_INFO[key].flags ?? []) mask |= CptFlag[name];
	return mask;
}

/** "su (kPa)", "FC (%)", "Ic": the label with its unit unless dimensionless. */
export function labelWithUnit(p: Pick<PropertyInfo, 'label' | 'unit'>): string {
	return p.unit === '–' || p.unit === '' ? p.label : `${p.label} (${p.unit})`;
}

/** One option of a select list: the key and its text, e.g. "qc1Ncs (sands)", "qt (kPa)". */
export interface PropertyOption<K extends PropertyKey = PropertyKey> {
	key: K;
	text: string;
}

/** The select list of properties a unit or domain may be simulated in, with the soils each usually suits. */
export const SIMULATED_OPTIONS: PropertyOption<SimulatedProperty>[] = SIMULATED_PROPERTIES.map((key) => {
	const p = PROPERTY_INFO[key];
	return { key, text: p.suits ? `${labelWithUnit(p)} (${p.suits})` : labelWithUnit(p) };
});
/** The select list of the section's traces: every property, with its unit. */
export const SECTION_OPTIONS: PropertyOption[] = PROPERTY_KEYS.map((key) => ({ key, text: labelWithUnit(PROPERTY_INFO[key]) }));
