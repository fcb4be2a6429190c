import { and, asc, eq, inArray } from 'drizzle-orm';
import { csvLine, roundedCell } from '$lib/csv';
import { getDb } from '$lib/server/db';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';
import { recordAudit } from './audit';
import { contacts, soundings, units } from '$lib/server/db/site-schema';
import { ServiceError } from '$lib/server/errors';
import type { ContactPut, ContactsPatch } from '$lib/schemas/stratigraphy';
import { effectiveTops, interpolateContacts, locateSounding, type ContactStation, type StoredTop } from '$lib/site';
import { getSite } from './site';

/** A stored contact as the API returns it. */
export interface ContactView {
	soundingId: string;
	soundingName: string;
	unitId: string;
	topElevation: number;
	/** Interpolated from the neighbouring soundings rather than entered, picked or imported. */
	interpolated: boolean;
}

/** Every stored contact of the project, by sounding name then stacking order (the top unit's ground default is not stored). */
export function listContacts(projectId: string, db: DbOrTx = getDb()): ContactView[] {
	return db
		.select({
			soundingId: contacts.soundingId,
			soundingName: soundings.name,
			unitId: contacts.unitId,
			topElevation: contacts.topElevation,
			interpolated: contacts.interpolated
		})
		.from(contacts)
		.innerJoin(soundings, eq(soundings.id, contacts.soundingId))
		.innerJoin(units, eq(units.id, contacts.unitId))
		.where(eq(units.projectId, projectId))
		.orderBy(asc(soundings.name), asc(units.position))
		.all();
}

/**
 * Sets the top elevation of a unit at a sounding (creating or replacing the contact); the contact is then
 * measured, and the sounding's contacts no longer follow its neighbours.
 * @throws ServiceError 404 for a sounding or unit outside the project, 422 for a top above the ground surface
 */
export function putContact(projectId: string, input: ContactPut, db: DbOrTx = getDb()): ContactView {
	editContacts(projectId, { set: [input], remove: [], interpolate: [] }, db);
	const c = listContacts(projectId, db).find((x) => x.soundingId === input.soundingId && x.unitId === input.unitId)!;
	return c;
}

/**
 * Removes a contact (the unit is then absent at that sounding; the top unit starts at the ground surface again).
 * @throws ServiceError 404 when there is none
 */
export function deleteContact(projectId: string, soundingId: string, unitId: string, db: DbOrTx = getDb()): void {
	editContacts(projectId, { set: [], remove: [{ soundingId, unitId }], interpolate: [] }, db);
}

/** What editContacts changed. */
export interface ContactsEdit {
	set: number;
	removed: number;
	/** Soundings whose contacts now follow their neighbours again. */
	interpolated: number;
}

/**
 * Several contact edits at once, all or nothing: `set` tops (measured), `remove` contacts, and `interpolate`
 * soundings (their contacts are dropped and follow their neighbours again). Soundings touched by `set` or
 * `remove` stop following their neighbours. Interpolated contacts are brought up to date afterwards.
 * @throws ServiceError 404 for a sounding or unit outside the project or a contact to remove that does not
 *   exist; 422 for tops above the ground surface (all of them named) or a sounding both edited and interpolated
 */
export function editContacts(projectId: string, edit: ContactsPatch, db: DbOrTx = getDb()): ContactsEdit {
	const ids = [...new Set([...edit.set.map((c) => c.soundingId), ...edit.remove.map((c) => c.soundingId), ...edit.interpolate])];
	const found = ids.length
		? db
				.select({ id: soundings.id, name: soundings.name, ground: soundings.groundElevation })
				.from(soundings)
				.where(and(eq(soundings.projectId, projectId), inArray(soundings.id, ids)))
				.all()
		: [];
	const byId = new Map(found.map((s) => [s.id, s]));
	if (found.length !== ids.length) throw new ServiceError(404, 'Sounding not found.');
	const unitNames = new Map(
		db.select({ id: units.id, name: units.name }).from(units).where(eq(units.projectId, projectId)).all().map((u) => [u.id, u.name])
	);
	for (const c of [...edit.set, ...edit.remove]) if (!unitNames.has(c.unitId)) throw new ServiceError(404, 'Unit not found.');

	const interpolate = new Set(edit.interpolate);
	const both = [...edit.set, ...edit.remove].find((c) => interpolate.has(c.soundingId));
	if (both) throw new ServiceError(422, `${byId.get(both.soundingId)!.name} cannot be both edited and given interpolated contacts in one request.`);
	const key = (c: { soundingId: string; unitId: string }) => `${c.soundingId}|${c.unitId}`;
	const setKeys = new Set(edit.set.map(key));
	const clash = edit.remove.find((c) => setKeys.has(key(c)));
	if (clash) throw new ServiceError(422, `The top of ${unitNames.get(clash.unitId)} at ${byId.get(clash.soundingId)!.name} is both set and removed.`);

	// A millimetre of slack lets the top unit sit at a ground elevation typed with rounding.
	const above = edit.set.filter((c) => c.topElevation > byId.get(c.soundingId)!.ground + 1e-3);
	if (above.length) {
		const named = above.slice(0, 5).map((c) => {
			const s = byId.get(c.soundingId)!;
			return `${unitNames.get(c.unitId)} at ${s.name}: ${c.topElevation} above the ground surface (${s.ground})`;
		});
		const more = above.length > named.length ? `, and ${above.length - named.length} more` : '';
		const message =
			edit.set.length === 1
				? `The top elevation ${above[0].topElevation} lies above the ground surface of ${byId.get(above[0].soundingId)!.name} (${byId.get(above[0].soundingId)!.ground}).`
				: `${above.length} ${above.length === 1 ? 'top lies' : 'tops lie'} above the ground surface: ${named.join('; ')}${more}. Nothing was saved.`;
		throw new ServiceError(422, message);
	}

	return inTransaction(db, (tx) => {
		// Recorded first: a later failure (a contact to remove that does not exist) rolls the entry back with the rest.
		const entry = contactsEntry(projectId, edit, byId, unitNames);
		if (entry) recordAudit(tx, entry);
		let removed = 0;
		for (const c of edit.remove) {
			const r = tx.delete(contacts).where(and(eq(contacts.soundingId, c.soundingId), eq(contacts.unitId, c.unitId))).run();
			if (r.changes === 0) throw new ServiceError(404, 'Contact not found.');
			removed++;
		}
		for (const c of edit.set) {
			tx.insert(contacts)
				.values({ soundingId: c.soundingId, unitId: c.unitId, topElevation: c.topElevation, interpolated: false })
				.onConflictDoUpdate({ target: [contacts.soundingId, contacts.unitId], set: { topElevation: c.topElevation, interpolated: false } })
				.run();
		}
		const edited = [...new Set([...edit.set, ...edit.remove].map((c) => c.soundingId))];
		if (edited.length) tx.update(soundings).set({ contactsEdited: true }).where(inArray(soundings.id, edited)).run();
		if (interpolate.size) {
			tx.delete(contacts).where(inArray(contacts.soundingId, [...interpolate])).run();
			tx.update(soundings).set({ contactsEdited: false }).where(inArray(soundings.id, [...interpolate])).run();
		}
		refreshInterpolatedContacts(projectId, tx);
		return { set: edit.set.length, removed, interpolated: interpolate.size };
	});
}

/** The audit entry of a contacts edit: what was set, removed and left to interpolation, by sounding and unit; null for none. */
function contactsEntry(
	projectId: string,
	edit: ContactsPatch,
	soundingsById: Map<string, { name: string }>,
	unitNames: Map<string, string>
): Parameters<typeof recordAudit>[1] | null {
	if (edit.set.length + edit.remove.length + edit.interpolate.length === 0) return null;
	const named = (c: { soundingId: string; unitId: string }) => `${unitNames.get(c.unitId)} at ${soundingsById.get(c.soundingId)!.name}`;
	const parts: string[] = [];
	if (edit.set.length) parts.push(`set ${edit.set.slice(0, 10).map((c) => `${named(c)} = ${c.topElevation}`).join(', ')}${edit.set.length > 10 ? ` and ${edit.set.length - 10} more` : ''}`);
	if (edit.remove.length) parts.push(`removed ${edit.remove.slice(0, 10).map(named).join(', ')}${edit.remove.length > 10 ? ` and ${edit.remove.length - 10} more` : ''}`);
	if (edit.interpolate.length) parts.push(`interpolated at ${edit.interpolate.map((id) => soundingsById.get(id)!.name).join(', ')}`);
	const soundingNames = [...new Set([...edit.set, ...edit.remove].map((c) => c.soundingId).concat(edit.interpolate))].map((id) => soundingsById.get(id)!.name);
	const n = edit.set.length + edit.remove.length + edit.interpolate.length;
	return {
		projectId,
		kind: 'contact',
		action: 'changed',
		subject: soundingNames.length === 1 ? `Contacts at ${soundingNames[0]}` : `${n} contact edits at ${soundingNames.length} soundings`,
		subjectId: soundingNames.length === 1 ? [...edit.set, ...edit.remove].map((c) => c.soundingId).concat(edit.interpolate)[0] : null,
		detail: parts.join('; ')
	};
}

/**
 * Brings interpolated contacts up to date. A sounding without contacts of its own (none measured, and none
 * set or removed by anyone since it was added) takes its contacts from the soundings that have their own,
 * interpolated along chainage (in 3D over their triangulation in plan; interpolateContacts), stored flagged as
 * interpolated and rounded to thousandths of the length unit; the top unit keeps its ground-surface default
 * unless its neighbours store a top for it. A
 * sounding that cannot be placed loses its interpolated contacts. Run after anything that changes contacts,
 * soundings or the section line; cheap (one pass over the project's soundings and contacts).
 * Returns the number of soundings whose contacts changed.
 */
export function refreshInterpolatedContacts(projectId: string, db: DbOrTx = getDb()): number {
	const unitIds = db
		.select({ id: units.id })
		.from(units)
		.where(eq(units.projectId, projectId))
		.orderBy(asc(units.position), asc(units.name))
		.all()
		.map((u) => u.id);
	if (unitIds.length === 0) return 0;
	const site = getSite(projectId, db);
	const rows = db
		.select({ id: soundings.id, x: soundings.x, y: soundings.y, chainage: soundings.chainage, ground: soundings.groundElevation, edited: soundings.contactsEdited })
		.from(soundings)
		.where(eq(soundings.projectId, projectId))
		.all();
	const stored = new Map<string, { unitId: string; top: number; interpolated: boolean }[]>();
	for (const c of db
		.select({ soundingId: contacts.soundingId, unitId: contacts.unitId, top: contacts.topElevation, interpolated: contacts.interpolated })
		.from(contacts)
		.innerJoin(units, eq(units.id, contacts.unitId))
		.where(eq(units.projectId, projectId))
		.all()) {
		if (!stored.has(c.soundingId)) stored.set(c.soundingId, []);
		stored.get(c.soundingId)!.push(c);
	}

	const stations: ContactStation[] = [];
	const targets: (typeof rows)[number][] = [];
	for (const r of rows) {
		const own = stored.get(r.id) ?? [];
		if (!r.edited && !own.some((c) => !c.interpolated)) targets.push(r);
		else if (own.length > 0) {
			stations.push({ chainage: locateSounding(site, r).chainage, x: r.x, y: r.y, tops: new Map(own.map((c) => [c.unitId, c.top])) });
		}
	}

	let changed = 0;
	for (const t of targets) {
		const exact = interpolateContacts(stations, unitIds, { chainage: locateSounding(site, t).chainage, x: t.x, y: t.y, groundElevation: t.ground }, site.geometry);
		// To the millimetre (or thousandth of a foot): as precise as anyone types a contact, and no binary noise.
		const want = new Map([...(exact ?? [])].map(([u, top]) => [u, Math.round(top * 1000) / 1000]));
		const have = stored.get(t.id) ?? [];
		const same = have.length === want.size && have.every((c) => want.get(c.unitId) === c.top);
		if (same) continue;
		db.delete(contacts).where(eq(contacts.soundingId, t.id)).run();
		for (const [unitId, topElevation] of want) db.insert(contacts).values({ soundingId: t.id, unitId, topElevation, interpolated: true }).run();
		changed++;
	}
	return changed;
}

/**
 * The contacts table as CSV text: one row per sounding (by chainage, then name) with its location and ground
 * elevation, and for each unit its top elevation and where the top comes from (measured, interpolated, or
 * ground: the top unit's default). Lengths in the project's unit, coordinates to the centimetre, elevations
 * to the millimetre; an absent unit leaves both cells blank.
 */
export function contactsCsv(projectId: string, db: DbOrTx = getDb()): string {
	const site = getSite(projectId, db);
	const lu = site.lengthUnit;
	const unitRows = db.select({ id: units.id, name: units.name }).from(units).where(eq(units.projectId, projectId)).orderBy(asc(units.position), asc(units.name)).all();
	const unitIds = unitRows.map((u) => u.id);
	const byS = new Map<string, Map<string, StoredTop>>();
	for (const c of listContacts(projectId, db)) {
		if (!byS.has(c.soundingId)) byS.set(c.soundingId, new Map());
		byS.get(c.soundingId)!.set(c.unitId, { top: c.topElevation, interpolated: c.interpolated });
	}
	const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
	const list = db
		.select({ id: soundings.id, name: soundings.name, x: soundings.x, y: soundings.y, chainage: soundings.chainage, ground: soundings.groundElevation })
		.from(soundings)
		.where(eq(soundings.projectId, projectId))
		.all()
		.map((s) => ({ ...s, at: locateSounding(site, s).chainage }))
		.sort((a, b) => (a.at ?? Infinity) - (b.at ?? Infinity) || collator.compare(a.name, b.name));
	const head = ['sounding', `easting (${lu})`, `northing (${lu})`, `chainage (${lu})`, `ground elevation (${lu})`, ...unitRows.flatMap((u) => [`${u.name} top (${lu})`, `${u.name} source`])];
	const lines = list.map((s) => {
		const tops = effectiveTops(unitIds, byS.get(s.id) ?? new Map(), s.ground);
		return csvLine([
			s.name,
			roundedCell(s.x, 2),
			roundedCell(s.y, 2),
			roundedCell(s.at, 2),
			roundedCell(s.ground, 3),
			...unitIds.flatMap((id) => {
				const t = tops.get(id);
				return t ? [roundedCell(t.top, 3), t.source] : ['', ''];
			})
		]);
	});
	return [csvLine(head), ...lines].join('\r\n') + '\r\n';
}
