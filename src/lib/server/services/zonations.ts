import { and, asc, eq, inArray, ne } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { domainMembers, domains, soundings, units, zonations, type Domain, type Zonation } from '$lib/server/db/site-schema';
import { ServiceError } from '$lib/server/errors';
import type { DomainCreate, DomainUpdate, MemberInput, ZonationCreate, ZonationUpdate } from '$lib/schemas/stratigraphy';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';
import { DEFAULT_RULES, domainDefaults, membersOverlap, WHOLE_UNIT, type ConditioningRules } from '$lib/site';
import { getSite } from './site';
import { listUnits, type UnitView } from './stratigraphy';
import { recordAudit } from './audit';

export interface MemberView {
	unitId: string;
	unitName: string;
	/** −1 for the whole unit, else the zone index counted by chainage from 0. */
	zone: number;
	zoneName: string;
}

export interface DomainView {
	id: string;
	name: string;
	position: number;
	property: Domain['property'];
	cellHeight: number | null;
	averaging: Domain['averaging'];
	/** Cell for declustering weights; z null means one cell over the full height. Null: equal weights. */
	declusterCell: { x: number; y: number; z: number | null } | null;
	/** Which readings condition the domain (DEFAULT_RULES when none were saved). */
	rules: ConditioningRules;
	members: MemberView[];
}

export interface ZonationView {
	id: string;
	name: string;
	description: string;
	domains: DomainView[];
}

/** Every zonation of the project with its domains and their members. */
export function listZonations(projectId: string, db: DbOrTx = getDb()): ZonationView[] {
	const zs = db.select().from(zonations).where(eq(zonations.projectId, projectId)).orderBy(asc(zonations.createdAt), asc(zonations.name)).all();
	return views(zs, listUnits(projectId, db), db);
}

export function getZonation(projectId: string, zonationId: string, db: DbOrTx = getDb()): ZonationView {
	const z = db.select().from(zonations).where(and(eq(zonations.id, zonationId), eq(zonations.projectId, projectId))).get();
	if (!z) throw new ServiceError(404, 'Zonation not found.');
	return views([z], listUnits(projectId, db), db)[0];
}

/** Creates a zonation, optionally with its domains (settings left out take the defaults, as createDomain), in one transaction. */
export function createZonation(projectId: string, input: ZonationCreate, db: DbOrTx = getDb()): ZonationView {
	const unitList = listUnits(projectId, db);
	checkUniqueName(db, projectId, input.name);
	const names = input.domains.map((d) => d.name.toLowerCase());
	if (new Set(names).size !== names.length) throw new ServiceError(409, 'Two domains of a zonation cannot share a name.');
	const all = input.domains.flatMap((d) => d.members ?? []);
	checkMembers(all, unitList, []);
	for (const d of input.domains) if (d.rules) checkRuleSoundings(db, projectId, d.rules);
	const id = inTransaction(db, (tx) => {
		const z = tx.insert(zonations).values({ projectId, name: input.name, description: input.description }).returning().get();
		const lengthUnit = getSite(projectId, tx).lengthUnit;
		input.domains.forEach((d, k) => insertDomain(tx, z.id, d, k, lengthUnit));
		const detail = input.domains.length ? `domains ${input.domains.map((d) => d.name).join(', ')}` : 'no domains yet';
		recordAudit(tx, { projectId, kind: 'zonation', action: 'created', subject: input.name, subjectId: z.id, detail });
		return z.id;
	});
	return getZonation(projectId, id, db);
}

export function updateZonation(projectId: string, zonationId: string, input: ZonationUpdate, db: DbOrTx = getDb()): ZonationView {
	const before = getZonation(projectId, zonationId, db);
	if (input.name) checkUniqueName(db, projectId, input.name, zonationId);
	if (Object.keys(input).length) {
		inTransaction(db, (tx) => {
			tx.update(zonations).set(input).where(eq(zonations.id, zonationId)).run();
			const detail = Object.entries(input)
				.filter(([k, v]) => v !== undefined && v !== before[k as keyof typeof before])
				.map(([k, v]) => `${k}: ${JSON.stringify(before[k as keyof typeof before])} → ${JSON.stringify(v)}`)
				.join('; ');
			recordAudit(tx, { projectId, kind: 'zonation', action: 'changed', subject: input.name ?? before.name, subjectId: zonationId, detail });
		});
	}
	return getZonation(projectId, zonationId, db);
}

/** Deletes a zonation with its domains (and their variograms). */
export function deleteZonation(projectId: string, zonationId: string, db: DbOrTx = getDb()): void {
	const z = getZonation(projectId, zonationId, db);
	inTransaction(db, (tx) => {
		tx.delete(zonations).where(eq(zonations.id, zonationId)).run();
		recordAudit(tx, { projectId, kind: 'zonation', action: 'deleted', subject: z.name, subjectId: zonationId, detail: `with its domains ${z.domains.map((d) => d.name).join(', ')} and their variograms` });
	});
}

/** A domain with the zonation it belongs to. */
export interface DomainWithZonation {
	domain: DomainView;
	zonation: { id: string; name: string };
}

export function getDomain(projectId: string, domainId: string, db: DbOrTx = getDb()): DomainWithZonation {
	const row = db
		.select({ zid: zonations.id })
		.from(domains)
		.innerJoin(zonations, eq(zonations.id, domains.zonationId))
		.where(and(eq(domains.id, domainId), eq(zonations.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Domain not found.');
	const z = getZonation(projectId, row.zid, db);
	return { domain: z.domains.find((d) => d.id === domainId)!, zonation: { id: z.id, name: z.name } };
}

/**
 * Adds a domain at the end of a zonation. Settings left out take the defaults of domainDefaults ($lib/site):
 * samples averaged to 0.2 m (0.5 ft) cells, 40 m (130 ft) plan cells for declustering.
 */
export function createDomain(projectId: string, zonationId: string, input: DomainCreate, db: DbOrTx = getDb()): DomainView {
	const z = getZonation(projectId, zonationId, db);
	if (z.domains.some((d) => d.name.toLowerCase() === input.name.toLowerCase())) {
		throw new ServiceError(409, `The zonation already has a domain named ${input.name}.`);
	}
	checkMembers(input.members ?? [], listUnits(projectId, db), z.domains);
	if (input.rules) checkRuleSoundings(db, projectId, input.rules);
	const id = inTransaction(db, (tx) => {
		const created = insertDomain(tx, zonationId, input, z.domains.length, getSite(projectId, tx).lengthUnit);
		recordAudit(tx, { projectId, kind: 'domain', action: 'created', subject: `${input.name} (${z.name})`, subjectId: created, detail: `simulated in ${input.property}` });
		return created;
	});
	return getDomain(projectId, id, db).domain;
}

/** Changes a domain's fields; `members`, when given, replaces its members. */
export function updateDomain(projectId: string, domainId: string, input: DomainUpdate, db: DbOrTx = getDb()): DomainView {
	const { domain, zonation } = getDomain(projectId, domainId, db);
	const z = getZonation(projectId, zonation.id, db);
	const others = z.domains.filter((d) => d.id !== domain.id);
	if (input.name && others.some((d) => d.name.toLowerCase() === input.name!.toLowerCase())) {
		throw new ServiceError(409, `The zonation already has a domain named ${input.name}.`);
	}
	if (input.members) checkMembers(input.members, listUnits(projectId, db), others);
	if (input.rules) checkRuleSoundings(db, projectId, input.rules);
	const { members, declusterCell, ...fields } = input;
	inTransaction(db, (tx) => {
		recordAudit(tx, { projectId, kind: 'domain', action: input.rules && Object.keys(input).length === 1 ? 'changed rules of' : 'changed', subject: `${input.name ?? domain.name} (${zonation.name})`, subjectId: domainId, detail: domainChanges(domain, input) });
		const set = { ...fields, ...(declusterCell !== undefined ? { declusterCell: storedCell(declusterCell) } : {}) };
		if (Object.keys(set).length) tx.update(domains).set(set).where(eq(domains.id, domainId)).run();
		if (members) {
			tx.delete(domainMembers).where(eq(domainMembers.domainId, domainId)).run();
			for (const m of dedupe(members)) tx.insert(domainMembers).values({ domainId, unitId: m.unitId, zone: m.zone }).run();
		}
	});
	return getDomain(projectId, domainId, db).domain;
}

export function deleteDomain(projectId: string, domainId: string, db: DbOrTx = getDb()): void {
	const { domain, zonation } = getDomain(projectId, domainId, db);
	inTransaction(db, (tx) => {
		tx.delete(domains).where(eq(domains.id, domainId)).run();
		recordAudit(tx, { projectId, kind: 'domain', action: 'deleted', subject: `${domain.name} (${zonation.name})`, subjectId: domainId, detail: 'with its variograms' });
	});
}

/** What a domain update changes, in words: each field that differs, rules and members summarised. */
function domainChanges(domain: DomainView, input: DomainUpdate): string {
	const parts: string[] = [];
	for (const [k, v] of Object.entries(input)) {
		if (v === undefined || k === 'members') continue;
		const old = (domain as unknown as Record<string, unknown>)[k];
		if (JSON.stringify(v) === JSON.stringify(old)) continue;
		if (k === 'rules' && old && typeof old === 'object') {
			for (const [rk, rv] of Object.entries(v as object)) {
				const ro = (old as Record<string, unknown>)[rk];
				if (JSON.stringify(rv) !== JSON.stringify(ro)) parts.push(`rule ${rk}: ${JSON.stringify(ro)} → ${JSON.stringify(rv)}`);
			}
		} else parts.push(`${k}: ${JSON.stringify(old)} → ${JSON.stringify(v)}`);
	}
	if (input.members) parts.push(`members replaced (${input.members.length})`);
	return parts.join('; ');
}

/**
 * Checks members against the project's units and against the other domains of the zonation.
 * @throws ServiceError 422 for an unknown unit or a zone the unit does not have; 409 for an overlap
 */
export function checkMembers(members: MemberInput[], unitList: UnitView[], otherDomains: Pick<DomainView, 'name' | 'members'>[]): void {
	const byId = new Map(unitList.map((u) => [u.id, u]));
	const list = dedupe(members);
	for (const m of list) {
		const u = byId.get(m.unitId);
		if (!u) throw new ServiceError(422, 'A member names a unit that is not in this project.');
		if (m.zone !== WHOLE_UNIT && m.zone >= u.zoneNames.length) {
			throw new ServiceError(422, `${u.name} has ${u.zoneNames.length} zone${u.zoneNames.length === 1 ? '' : 's'}; zone ${m.zone} does not exist.`);
		}
	}
	for (let i = 0; i < list.length; i++) {
		for (let j = i + 1; j < list.length; j++) {
			if (membersOverlap(list[i], list[j])) {
				throw new ServiceError(409, `${describe(list[i], byId)} is given twice; a unit or zone belongs to at most one domain of a zonation.`);
			}
		}
		for (const d of otherDomains) {
			if (d.members.some((o) => membersOverlap(list[i], o))) {
				throw new ServiceError(409, `${describe(list[i], byId)} already belongs to the domain ${d.name} of this zonation.`);
			}
		}
	}
}

/**
 * Checks that the soundings a domain's rules leave out exist in the project.
 * @throws ServiceError 422 naming the first unknown sounding
 */
function checkRuleSoundings(db: DbOrTx, projectId: string, rules: ConditioningRules): void {
	if (rules.excludedSoundings.length === 0) return;
	const names = new Set(
		db
			.select({ name: soundings.name })
			.from(soundings)
			.where(eq(soundings.projectId, projectId))
			.all()
			.map((r) => r.name)
	);
	const unknown = rules.excludedSoundings.find((n) => !names.has(n));
	if (unknown !== undefined) throw new ServiceError(422, `No sounding named ${unknown} in this project.`);
}

function describe(m: MemberInput, byId: Map<string, UnitView>): string {
	const u = byId.get(m.unitId)!;
	return m.zone === WHOLE_UNIT ? u.name : `${u.name} (${u.zoneNames[m.zone]})`;
}

function dedupe(members: MemberInput[]): MemberInput[] {
	const seen = new Set<string>();
	return members.filter((m) => {
		const k = `${m.unitId}|${m.zone}`;
		if (seen.has(k)) return false;
		seen.add(k);
		return true;
	});
}

function insertDomain(tx: DbOrTx, zonationId: string, d: DomainCreate, position: number, lengthUnit: 'm' | 'ft'): string {
	// Left out (undefined) takes the default; null asks for every reading or equal weights.
	const defaults = domainDefaults(lengthUnit);
	const cellHeight = d.cellHeight === undefined ? defaults.cellHeight : d.cellHeight;
	const row = tx
		.insert(domains)
		.values({
			zonationId,
			name: d.name,
			position,
			property: d.property,
			cellHeight,
			averaging: d.averaging ?? (cellHeight === null ? 'none' : defaults.averaging),
			declusterCell: storedCell(d.declusterCell === undefined ? defaults.declusterCell : d.declusterCell),
			rules: d.rules ?? null
		})
		.returning()
		.get();
	for (const m of dedupe(d.members ?? [])) tx.insert(domainMembers).values({ domainId: row.id, unitId: m.unitId, zone: m.zone }).run();
	return row.id;
}

// JSON has no Infinity, so "one cell over the full height" is stored as z: null.
function storedCell(cell: { x: number; y: number; z: number | null } | null): Domain['declusterCell'] {
	return cell as Domain['declusterCell'];
}

function checkUniqueName(db: DbOrTx, projectId: string, name: string, exceptId?: string): void {
	const same = db
		.select({ id: zonations.id, name: zonations.name })
		.from(zonations)
		.where(and(eq(zonations.projectId, projectId), exceptId ? ne(zonations.id, exceptId) : undefined))
		.all()
		.some((z) => z.name.toLowerCase() === name.toLowerCase());
	if (same) throw new ServiceError(409, `A zonation named ${name} already exists.`);
}

function views(zs: Zonation[], unitList: UnitView[], db: DbOrTx): ZonationView[] {
	if (zs.length === 0) return [];
	const ds = db
		.select()
		.from(domains)
		.where(inArray(domains.zonationId, zs.map((z) => z.id)))
		.orderBy(asc(domains.position), asc(domains.name))
		.all();
	const ms = ds.length
		? db
				.select({ domainId: domainMembers.domainId, unitId: domainMembers.unitId, zone: domainMembers.zone, position: units.position })
				.from(domainMembers)
				.innerJoin(units, eq(units.id, domainMembers.unitId))
				.where(inArray(domainMembers.domainId, ds.map((d) => d.id)))
				.orderBy(asc(units.position), asc(domainMembers.zone))
				.all()
		: [];
	const byUnit = new Map(unitList.map((u) => [u.id, u]));
	return zs.map((z) => ({
		id: z.id,
		name: z.name,
		description: z.description,
		domains: ds
			.filter((d) => d.zonationId === z.id)
			.map((d) => ({
				id: d.id,
				name: d.name,
				position: d.position,
				property: d.property,
				cellHeight: d.cellHeight,
				averaging: d.averaging,
				declusterCell: d.declusterCell ? { x: d.declusterCell.x, y: d.declusterCell.y, z: Number.isFinite(d.declusterCell.z) ? d.declusterCell.z : null } : null,
				rules: { ...DEFAULT_RULES, ...(d.rules ?? {}) },
				members: ms
					.filter((m) => m.domainId === d.id)
					.map((m) => {
						const u = byUnit.get(m.unitId)!;
						return {
							unitId: m.unitId,
							unitName: u.name,
							zone: m.zone,
							zoneName: m.zone === WHOLE_UNIT ? 'whole unit' : (u.zoneNames[m.zone] ?? `zone ${m.zone} (no longer defined)`)
						};
					})
			}))
	}));
}
