/** The zone index that stands for a whole unit in a domain's members. */
export const WHOLE_UNIT = -1;

/** A domain member: a unit, whole (zone −1) or one of its zones (counted by chainage from 0). */
export interface Member {
	unitId: string;
	zone: number;
}

/**
 * True when two members claim overlapping ground: the same unit, and the same zone or either the whole unit.
 * A (unit, zone) belongs to at most one domain of a zonation.
 */
export function membersOverlap(a: Member, b: Member): boolean {
	return a.unitId === b.unitId && (a.zone === b.zone || a.zone === WHOLE_UNIT || b.zone === WHOLE_UNIT);
}
