import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';
import { soundings, units, zoneBoundaries, type Unit, type ZoneBoundary } from '$lib/server/db/site-schema';
import { ServiceError } from '$lib/server/errors';
import type { UnitCreate, UnitUpdate, ZoneBoundaryInput } from '$lib/schemas/stratigraphy';
import { PROPERTY_INFO, type PropertyKey } from '$lib/properties';
import { contactLines, effectiveTops, locateSounding, zoneNamesOf, type BoundaryLine, type ContactSource, type StoredTop } from '$lib/site';
import { listContacts, refreshInterpolatedContacts } from './contacts';
import { deriveSoundings } from './derived';
import { listSoundings } from './soundings';
import { getSite, updateSite, type SiteUpdate, type SiteView } from './site';
import { recordAudit } from './audit';

// The contacts' own service; named here too for callers that take the whole stratigraphy from one place.
export { deleteContact, listContacts, putContact, type ContactView } from './contacts';

/**
 * Default unit colours, our own set: earthy hues that stay apart from each other and from the teal accent,
 * light enough for dark labels on top. A new unit takes the next one not in use.
 */
export const DEFAULT_UNIT_COLOURS = [
	'#a3845a', // umber
	'#dcbf62', // ochre
	'#6f8f99', // slate
	'#c0763f', // rust
	'#8d9a63', // olive
	'#b07a88', // heather
	'#5f8a70', // moss
	'#cfa38a', // terracotta pink
	'#8a7fa6', // lavender grey
	'#9c9a8f' // stone
] as const;

/** A unit as the API returns it, with its zone names resolved against its zone boundaries. */
export interface UnitView {
	id: string;
	name: string;
	colour: string;
	position: number;
	gammaAbove: number;
	gammaBelow: number;
	nkt: number;
	cfc: number;
	property: Unit['property'];
	/** One name per zone, west to east (by chainage); one entry, the unit's name, when it has no boundaries. */
	zoneNames: string[];
	/** The zone names as saved, which may be given before the boundaries that make the zones exist. */
	savedZoneNames: string[];
}

export function unitView(u: Unit, boundaryCount: number): UnitView {
	return {
		id: u.id,
		name: u.name,
		colour: u.colour,
		position: u.position,
		gammaAbove: u.gammaAbove,
		gammaBelow: u.gammaBelow,
		nkt: u.nkt,
		cfc: u.cfc,
		property: u.property,
		zoneNames: zoneNamesOf(u, boundaryCount),
		savedZoneNames: u.zoneNames ?? []
	};
}

/** The project's units in stacking order (position 0 on top). */
export function listUnits(projectId: string, db: DbOrTx = getDb()): UnitView[] {
	const rows = db.select().from(units).where(eq(units.projectId, projectId)).orderBy(asc(units.position), asc(units.name)).all();
	const counts = boundaryCounts(projectId, db);
	return rows.map((u) => unitView(u, counts.get(u.id) ?? 0));
}

export function getUnit(projectId: string, unitId: string, db: DbOrTx = getDb()): Unit {
	const u = db.select().from(units).where(and(eq(units.id, unitId), eq(units.projectId, projectId))).get();
	if (!u) throw new ServiceError(404, 'Unit not found.');
	return u;
}

/**
 * Adds a unit at `position` (default: at the bottom), shifting the units below it down; takes the next free
 * default colour. The API asks for the property (unitCreateSchema); code that leaves it out gets qc1Ncs.
 */
export function createUnit(projectId: string, input: Omit<UnitCreate, 'property'> & Partial<Pick<UnitCreate, 'property'>>, db: DbOrTx = getDb()): UnitView {
	const existing = db.select().from(units).where(eq(units.projectId, projectId)).orderBy(asc(units.position)).all();
	if (existing.some((u) => u.name.toLowerCase() === input.name.toLowerCase())) {
		throw new ServiceError(409, `A unit named ${input.name} already exists.`);
	}
	const used = new Set(existing.map((u) => u.colour));
	const colour = input.colour ?? DEFAULT_UNIT_COLOURS.find((c) => !used.has(c)) ?? DEFAULT_UNIT_COLOURS[existing.length % DEFAULT_UNIT_COLOURS.length];
	const position = Math.min(input.position ?? existing.length, existing.length);
	const run = (tx: DbOrTx) => {
		const created = tx
			.insert(units)
			.values({ ...input, projectId, colour, position: existing.length })
			.returning()
			.get();
		restack(tx, [...existing.map((u) => u.id).slice(0, position), created.id, ...existing.map((u) => u.id).slice(position)]);
		recordAudit(tx, { projectId, kind: 'unit', action: 'created', subject: created.name, subjectId: created.id, detail: `simulated in ${created.property}, position ${position + 1}` });
		return created.id;
	};
	const id = inTransaction(db, run);
	return listUnits(projectId, db).find((u) => u.id === id)!;
}

/** Changes a unit's fields; a new position moves it in the stack and renumbers the others. */
export function updateUnit(projectId: string, unitId: string, input: UnitUpdate, db: DbOrTx = getDb()): UnitView {
	const unit = getUnit(projectId, unitId, db);
	const existing = db.select().from(units).where(eq(units.projectId, projectId)).orderBy(asc(units.position)).all();
	if (input.name && existing.some((u) => u.id !== unitId && u.name.toLowerCase() === input.name!.toLowerCase())) {
		throw new ServiceError(409, `A unit named ${input.name} already exists.`);
	}
	const { position, ...fields } = input;
	inTransaction(db, (tx) => {
		recordAudit(tx, { projectId, kind: 'unit', action: 'changed', subject: input.name ?? unit.name, subjectId: unit.id, detail: changedFields(unit, input) });
		if (Object.keys(fields).length > 0) tx.update(units).set(fields).where(eq(units.id, unit.id)).run();
		if (position !== undefined && position !== unit.position) {
			const order = existing.map((u) => u.id).filter((id) => id !== unit.id);
			order.splice(Math.min(position, order.length), 0, unit.id);
			restack(tx, order);
		}
	});
	return listUnits(projectId, db).find((u) => u.id === unitId)!;
}

/** "name: A → B; nkt: 14 → 16" for the fields of `input` that differ from `before`. */
function changedFields<T extends object>(before: T, input: Partial<T>): string {
	const parts: string[] = [];
	for (const [k, v] of Object.entries(input)) {
		const old = (before as Record<string, unknown>)[k];
		if (v !== undefined && JSON.stringify(v) !== JSON.stringify(old)) parts.push(`${k}: ${JSON.stringify(old)} → ${JSON.stringify(v)}`);
	}
	return parts.join('; ');
}

/** Deletes a unit with its contacts, zone boundaries and domain memberships; the others close up. */
export function deleteUnit(projectId: string, unitId: string, db: DbOrTx = getDb()): void {
	const unit = getUnit(projectId, unitId, db);
	inTransaction(db, (tx) => {
		recordAudit(tx, { projectId, kind: 'unit', action: 'deleted', subject: unit.name, subjectId: unit.id, detail: 'with its contacts, zone boundaries and domain memberships' });
		tx.delete(units).where(eq(units.id, unitId)).run();
		const rest = tx.select({ id: units.id }).from(units).where(eq(units.projectId, projectId)).orderBy(asc(units.position)).all();
		restack(tx, rest.map((u) => u.id));
	});
}

/** A unit's top in the section: its stations at the soundings, and polylines between consecutive present ones. */
export interface SectionContact {
	unitId: string;
	/** Where the top comes from at each station (null where the unit is absent): see effectiveTops in $lib/site. */
	stations: { soundingId: string; chainage: number; topElevation: number | null; source: ContactSource | null }[];
	/** Runs of [chainage, elevation] between soundings where the unit is present, broken where it is absent. */
	lines: [number, number][][];
}

/**
 * The contacts of every unit along the section, interpolated linearly along chainage between soundings
 * (contactLines), the top unit starting at the ground surface where no top is stored for it (effectiveTops).
 * Soundings without a chainage are left out.
 */
export function sectionContacts(projectId: string, db: DbOrTx = getDb()): SectionContact[] {
	const site = getSite(projectId, db);
	const unitList = listUnits(projectId, db);
	const unitIds = unitList.map((u) => u.id);
	const stored = new Map<string, Map<string, StoredTop>>();
	for (const c of listContacts(projectId, db)) {
		if (!stored.has(c.soundingId)) stored.set(c.soundingId, new Map());
		stored.get(c.soundingId)!.set(c.unitId, { top: c.topElevation, interpolated: c.interpolated });
	}
	const located = db
		.select({ id: soundings.id, x: soundings.x, y: soundings.y, chainage: soundings.chainage, ground: soundings.groundElevation })
		.from(soundings)
		.where(eq(soundings.projectId, projectId))
		.all()
		.map((s) => ({ id: s.id, chainage: locateSounding(site, s).chainage, tops: effectiveTops(unitIds, stored.get(s.id) ?? new Map(), s.ground) }))
		.filter((s): s is { id: string; chainage: number; tops: ReturnType<typeof effectiveTops> } => s.chainage !== null)
		.sort((a, b) => a.chainage - b.chainage);
	return unitList.map((u) => {
		const stations = located.map((s) => {
			const t = s.tops.get(u.id);
			return { soundingId: s.id, chainage: s.chainage, topElevation: t?.top ?? null, source: t?.source ?? null };
		});
		return { unitId: u.id, stations, lines: contactLines(stations) };
	});
}

/**
 * Stores site settings (updateSite) and brings interpolated contacts up to date, since a new section line
 * moves the soundings' chainages. All or nothing.
 */
export function changeSite(projectId: string, input: SiteUpdate, db: DbOrTx = getDb()): SiteView {
	return inTransaction(db, (tx) => {
		const before = getSite(projectId, tx);
		const site = updateSite(projectId, input, tx);
		recordAudit(tx, { projectId, kind: 'site', action: 'changed', subject: 'Site settings', detail: changedFields(before, input) });
		refreshInterpolatedContacts(projectId, tx);
		return site;
	});
}

/** Everything the section plot draws. */
export interface SectionView {
	site: SiteView;
	property: { key: PropertyKey; label: string; unit: string };
	/** Located soundings by chainage, with the chosen property against elevation (null where undefined). */
	soundings: {
		id: string;
		name: string;
		chainage: number;
		offset: number | null;
		farOffLine: boolean;
		groundElevation: number;
		groundwaterElevation: number;
		elevation: number[];
		value: (number | null)[];
		/** Index into `units` per reading, −1 for none. */
		unit: number[];
		/** Its contacts follow its neighbours (none of its own). */
		contactsInterpolated: boolean;
	}[];
	/** Names of soundings without a chainage (not drawn). */
	unlocated: string[];
	units: UnitView[];
	contacts: SectionContact[];
	boundaries: ZoneBoundaryView[];
}

/** The section of a project: soundings as traces of a property at their chainage, contacts and zone boundaries. */
export function sectionView(projectId: string, property: PropertyKey, db: DbOrTx = getDb()): SectionView {
	const derived = deriveSoundings(projectId, undefined, db);
	const following = new Map(listSoundings(projectId, db).map((s) => [s.id, s.contactsInterpolated]));
	const info = PROPERTY_INFO[property];
	const located = derived.filter((d) => d.sounding.chainage !== null).sort((a, b) => a.sounding.chainage! - b.sounding.chainage!);
	return {
		site: getSite(projectId, db),
		property: { key: property, label: info.label, unit: info.unit },
		soundings: located.map((d) => {
			const values = property === 'qc' ? d.qc : property === 'fs' ? d.fs : property === 'u2' ? d.u2 : d.derived[property];
			return {
				id: d.sounding.id,
				name: d.sounding.name,
				chainage: d.sounding.chainage!,
				offset: d.sounding.offset,
				farOffLine: d.sounding.farOffLine,
				groundElevation: d.sounding.groundElevation,
				groundwaterElevation: d.sounding.groundwaterElevation,
				// Millimetres and five significant figures are finer than a plot can show and keep the payload small.
				elevation: Array.from(d.derived.elevation, (z) => Math.round(z * 1000) / 1000),
				value: Array.from({ length: d.depth.length }, (_, i) => {
					const v = values ? values[i] : NaN;
					return Number.isFinite(v) ? Number(v.toPrecision(5)) : null;
				}),
				unit: Array.from(d.unit),
				contactsInterpolated: following.get(d.sounding.id) ?? false
			};
		}),
		unlocated: derived.filter((d) => d.sounding.chainage === null).map((d) => d.sounding.name),
		units: listUnits(projectId, db),
		contacts: sectionContacts(projectId, db),
		boundaries: listZoneBoundaries(projectId, db)
	};
}

export interface ZoneBoundaryView extends BoundaryLine {
	id: string;
	unitId: string;
}

/** The project's zone boundaries, by unit then west to east. */
export function listZoneBoundaries(projectId: string, db: DbOrTx = getDb()): ZoneBoundaryView[] {
	return db
		.select({
			id: zoneBoundaries.id,
			unitId: zoneBoundaries.unitId,
			chainageTop: zoneBoundaries.chainageTop,
			elevationTop: zoneBoundaries.elevationTop,
			chainageBottom: zoneBoundaries.chainageBottom,
			elevationBottom: zoneBoundaries.elevationBottom
		})
		.from(zoneBoundaries)
		.innerJoin(units, eq(units.id, zoneBoundaries.unitId))
		.where(eq(units.projectId, projectId))
		.orderBy(asc(units.position), asc(zoneBoundaries.chainageTop))
		.all();
}

/** Boundaries grouped by unit id. */
export function boundariesByUnit(projectId: string, db: DbOrTx = getDb()): Map<string, ZoneBoundaryView[]> {
	const out = new Map<string, ZoneBoundaryView[]>();
	for (const b of listZoneBoundaries(projectId, db)) {
		if (!out.has(b.unitId)) out.set(b.unitId, []);
		out.get(b.unitId)!.push(b);
	}
	return out;
}

export function createZoneBoundary(projectId: string, input: ZoneBoundaryInput, db: DbOrTx = getDb()): ZoneBoundaryView {
	const unit = getUnit(projectId, input.unitId, db);
	return inTransaction(db, (tx) => {
		const row = tx.insert(zoneBoundaries).values(input).returning().get();
		recordAudit(tx, { projectId, kind: 'zone-boundary', action: 'created', subject: `${unit.name} boundary`, subjectId: row.id, detail: lineText(row) });
		return pickBoundary(row);
	});
}

export function updateZoneBoundary(projectId: string, id: string, input: ZoneBoundaryInput, db: DbOrTx = getDb()): ZoneBoundaryView {
	const before = getBoundary(projectId, id, db);
	const unit = getUnit(projectId, input.unitId, db);
	return inTransaction(db, (tx) => {
		const row = tx.update(zoneBoundaries).set(input).where(eq(zoneBoundaries.id, id)).returning().get();
		recordAudit(tx, { projectId, kind: 'zone-boundary', action: 'moved', subject: `${unit.name} boundary`, subjectId: id, detail: `${lineText(before)} → ${lineText(row)}` });
		return pickBoundary(row);
	});
}

export function deleteZoneBoundary(projectId: string, id: string, db: DbOrTx = getDb()): void {
	const before = getBoundary(projectId, id, db);
	const unit = getUnit(projectId, before.unitId, db);
	inTransaction(db, (tx) => {
		tx.delete(zoneBoundaries).where(eq(zoneBoundaries.id, id)).run();
		recordAudit(tx, { projectId, kind: 'zone-boundary', action: 'deleted', subject: `${unit.name} boundary`, subjectId: id, detail: lineText(before) });
	});
}

/** A boundary line in words: "(205, 6) to (205, −12)" as (chainage, elevation). */
function lineText(b: BoundaryLine): string {
	return `(${b.chainageTop}, ${b.elevationTop}) to (${b.chainageBottom}, ${b.elevationBottom})`;
}

function getBoundary(projectId: string, id: string, db: DbOrTx): ZoneBoundary {
	const row = db
		.select({ b: zoneBoundaries })
		.from(zoneBoundaries)
		.innerJoin(units, eq(units.id, zoneBoundaries.unitId))
		.where(and(eq(zoneBoundaries.id, id), eq(units.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Zone boundary not found.');
	return row.b;
}

function pickBoundary(b: ZoneBoundary): ZoneBoundaryView {
	const { id, unitId, chainageTop, elevationTop, chainageBottom, elevationBottom } = b;
	return { id, unitId, chainageTop, elevationTop, chainageBottom, elevationBottom };
}

function boundaryCounts(projectId: string, db: DbOrTx): Map<string, number> {
	const counts = new Map<string, number>();
	for (const b of listZoneBoundaries(projectId, db)) counts.set(b.unitId, (counts.get(b.unitId) ?? 0) + 1);
	return counts;
}

/** Writes positions 0…n−1 in the given order. */
function restack(db: DbOrTx, ids: string[]): void {
	ids.forEach((id, position) => db.update(units).set({ position }).where(eq(units.id, id)).run());
}
