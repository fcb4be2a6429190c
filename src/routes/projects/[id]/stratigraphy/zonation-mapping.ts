/**
 * The mapping table of a zonation: every unit, or each zone of a split unit, is a piece that belongs to at most one
 * of the zonation's domains. Pure functions between the stored members and the table's choices.
 */
import type { UnitView, ZonationView } from '$lib/api';

/** A row of the mapping table: a whole unit (zone −1) or one zone of a split unit. */
export interface Piece {
	key: string;
	unit: UnitView;
	zone: number;
	label: string;
}

export interface Member {
	unitId: string;
	zone: number;
}

/** The pieces of the units, in their order: a unit with several zones gives one piece a zone. */
export function piecesOf(units: readonly UnitView[]): Piece[] {
	return units.flatMap((u) =>
		u.zoneNames.length > 1
			? u.zoneNames.map((zn, k) => ({ key: `${u.id}|${k}`, unit: u, zone: k, label: `${u.name} — ${zn}` }))
			: [{ key: `${u.id}|-1`, unit: u, zone: -1, label: u.name }]
	);
}

/** Piece key → domain id ('' for none) from a zonation's members; a whole-unit member takes all its zones. */
export function assignmentOf(pieces: readonly Piece[], zonation: ZonationView | null): Record<string, string> {
	const out: Record<string, string> = {};
	for (const p of pieces) out[p.key] = '';
	for (const d of zonation?.domains ?? []) {
		for (const m of d.members) {
			for (const p of pieces) if (p.unit.id === m.unitId && (m.zone === -1 || m.zone === p.zone)) out[p.key] = d.id;
		}
	}
	return out;
}

/**
 * Members per domain from the table's choices; a unit whose zones all go to one domain is stored as the whole unit
 * (zone −1). Every domain of the zonation has an entry, empty when nothing maps to it.
 */
export function membersFrom(pieces: readonly Piece[], assignment: Readonly<Record<string, string>>, zonation: ZonationView | null): Map<string, Member[]> {
	const out = new Map<string, Member[]>((zonation?.domains ?? []).map((d) => [d.id, []]));
	const units = [...new Map(pieces.map((p) => [p.unit.id, p.unit])).values()];
	for (const u of units) {
		const mine = pieces.filter((p) => p.unit.id === u.id);
		const targets = new Set(mine.map((p) => assignment[p.key]));
		if (targets.size === 1 && !targets.has('')) {
			out.get([...targets][0])?.push({ unitId: u.id, zone: -1 });
			continue;
		}
		for (const p of mine) if (assignment[p.key]) out.get(assignment[p.key])?.push({ unitId: u.id, zone: p.zone });
	}
	return out;
}

export const sameMember = (a: Member, b: Member) => a.unitId === b.unitId && a.zone === b.zone;
