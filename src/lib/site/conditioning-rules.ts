/**
 * Rules that decide which readings of a domain's units condition it, saved with the domain. Lengths are in the
 * project's length unit, stresses in kPa. The defaults leave every reading in.
 */
export interface ConditioningRules {
	/** Readings within this distance above or below a contact at their sounding are left out (transition zones); 0: none. */
	contactBuffer: number;
	/** Readings shallower than this depth below the ground are left out; 0: none. */
	minDepth: number;
	/** Readings where σ′v is below this (kPa) are left out; 0: none. */
	minSigmaVeff: number;
	/** Soundings left out of the domain, by name. */
	excludedSoundings: string[];
	/** Readings flagged as outside the property's correlation (see the property catalogue): kept, or left out. */
	flagged: 'keep' | 'exclude';
}

export const DEFAULT_RULES: ConditioningRules = { contactBuffer: 0, minDepth: 0, minSigmaVeff: 0, excludedSoundings: [], flagged: 'keep' };

/** What the rules remove, in the order they are checked; a reading counts under the first rule that removes it. */
export const RULE_ORDER = ['sounding', 'noValue', 'minDepth', 'minSigmaVeff', 'contactBuffer', 'flagged'] as const;
export type RuleKey = (typeof RULE_ORDER)[number];

/** Readings of a domain's units and zones and what became of them (before averaging to the cell height). */
export type RuleCounts = { readings: number; kept: number } & Record<RuleKey, number>;

/** One reading as the rules see it. Lengths in the project's unit; σ′v in kPa (NaN where it is unknown). */
export interface RuleReading {
	value: number;
	/** Depth below the ground surface. */
	depth: number;
	elevation: number;
	sigmaVeff: number;
	/** The reading carries a flag of the domain property's correlation. */
	flagged: boolean;
}

/**
 * The rule that leaves a reading out of a domain, or null when it is kept. Checked in RULE_ORDER after the
 * sounding itself: a value the correlation does not define (NaN); depth below minDepth; σ′v below minSigmaVeff
 * (an unknown σ′v fails a set limit); a contact within contactBuffer above or below (|z − contact| < buffer);
 * a flagged reading when flagged readings are left out. `contacts` are the elevations of the contacts at the
 * reading's sounding below its ground surface.
 * Near the ground surface σ′v tends to zero, so normalised properties such as su/σ′v grow without bound
 * there (common practice: a desiccated crust reads far higher than the soft clay below); minDepth and
 * minSigmaVeff keep such readings out of a domain that stands for the soil below.
 */
export function readingRule(r: RuleReading, contacts: ArrayLike<number>, rules: ConditioningRules): RuleKey | null {
	if (!Number.isFinite(r.value)) return 'noValue';
	if (rules.minDepth > 0 && !(r.depth >= rules.minDepth)) return 'minDepth';
	if (rules.minSigmaVeff > 0 && !(r.sigmaVeff >= rules.minSigmaVeff)) return 'minSigmaVeff';
	if (rules.contactBuffer > 0) {
		for (let k = 0; k < contacts.length; k++) if (Math.abs(r.elevation - contacts[k]) < rules.contactBuffer) return 'contactBuffer';
	}
	if (rules.flagged === 'exclude' && r.flagged) return 'flagged';
	return null;
}

/** Counts with every entry 0. */
export function emptyRuleCounts(): RuleCounts {
	return { readings: 0, kept: 0, sounding: 0, noValue: 0, minDepth: 0, minSigmaVeff: 0, contactBuffer: 0, flagged: 0 };
}
