import { eq } from 'drizzle-orm';
import type { Ags4GeologyLayer, ParsedSounding } from '$lib/cpt';
import type { SimulatedProperty } from '$lib/properties';
import { contacts, units } from '$lib/server/db/site-schema';
import { createUnit } from './stratigraphy';
import type { DbOrTx } from '$lib/server/db/transaction';

/** Which project unit the layers of one GEOL key become; `unit` null leaves them out. */
export interface GeologyUnitChoice {
	key: string;
	/** A unit name: the project's unit of that name (case-insensitive), else a new unit so named. */
	unit: string | null;
	/** Property a new unit is simulated in; default the suggested one. */
	property?: SimulatedProperty;
}

/** The request to write contacts from the AGS4 GEOL groups of an upload. */
export interface GeologyRequest {
	units: GeologyUnitChoice[];
}

/** One GEOL key (the GEOL_GEOL code, or the description where the code is blank) with a suggested unit. */
export interface GeologyKey {
	key: string;
	/** Up to three of its descriptions, as the log gives them. */
	descriptions: string[];
	layers: number;
	locations: number;
	/** An existing unit whose name is the code or a description, else the key itself (a new unit). */
	suggestedUnit: string;
	existingUnit: boolean;
	/** From the description's soil words (a rule of our own): clay, silt, peat → su/σ′v; otherwise qc1Ncs. */
	suggestedProperty: SimulatedProperty;
}

/** What an upload's GEOL groups offer, and, when the request carries choices, what they will write. */
export interface GeologyOffer {
	files: string[];
	layers: number;
	/** LOCA_IDs with a log and a sounding in this upload, and those with a log only. */
	matched: string[];
	unmatched: string[];
	keys: GeologyKey[];
	/** Remarks a person should read before importing (a unit recurring down a log). */
	notes: string[];
	/** A GEOL group that cannot be read, per file; importing contacts from it is refused. */
	errors: { file: string; message: string }[];
	outcome?: { contacts: number; unitsCreated: string[]; unitsUsed: string[] };
}

/** A file of the upload with its GEOL layers (empty when it has none). */
export interface GeologySource {
	file: string;
	layers: Ags4GeologyLayer[];
	error?: string;
}

/** A sounding written by the import, with what the contacts need. */
export interface WrittenSounding {
	file: string;
	soundingId: string;
	sounding: ParsedSounding;
}

const keyOf = (l: Ags4GeologyLayer): string => l.code || l.description;

/**
 * The offer of an upload's GEOL groups: each key with a suggested unit and property, the locations matched to
 * the upload's soundings (by LOCA_ID, within the same file), and remarks. Null when no file has a GEOL group.
 */
export function geologyOffer(
	sources: GeologySource[],
	soundingsByFile: Map<string, ParsedSounding[]>,
	unitNames: string[],
	request?: GeologyRequest
): GeologyOffer | null {
	const withLog = sources.filter((s) => s.layers.length > 0 || s.error);
	if (withLog.length === 0) return null;
	const byKey = new Map<string, { layers: Ags4GeologyLayer[]; locations: Set<string>; descriptions: Set<string> }>();
	const matched = new Set<string>();
	const unmatched = new Set<string>();
	const notes: string[] = [];
	for (const src of withLog) {
		const locas = new Set((soundingsByFile.get(src.file) ?? []).map((s) => s.meta?.LOCA_ID).filter((v): v is string => !!v));
		for (const l of src.layers) {
			(locas.has(l.locaId) ? matched : unmatched).add(l.locaId);
			const k = keyOf(l);
			if (!k) continue;
			if (!byKey.has(k)) byKey.set(k, { layers: [], locations: new Set(), descriptions: new Set() });
			const entry = byKey.get(k)!;
			entry.layers.push(l);
			entry.locations.add(l.locaId);
			if (l.description) entry.descriptions.add(l.description);
		}
		for (const [loca, log] of groupBy(src.layers, (l) => l.locaId)) {
			if (!locas.has(loca)) continue;
			for (const r of recurrences(log)) {
				notes.push(`${loca}: ${r.key} again from ${r.top.toFixed(2)} m is read as ${r.readAs} (a unit has one top per sounding: its first, at ${r.first.toFixed(2)} m)`);
			}
		}
	}
	const lower = new Map(unitNames.map((n) => [n.toLowerCase(), n]));
	const keys: GeologyKey[] = [...byKey].map(([key, e]) => {
		const descriptions = [...e.descriptions].slice(0, 3);
		const existing = [key, ...e.descriptions].map((n) => lower.get(n.toLowerCase())).find((n) => n !== undefined);
		return {
			key,
			descriptions,
			layers: e.layers.length,
			locations: e.locations.size,
			suggestedUnit: existing ?? key.slice(0, 80),
			existingUnit: existing !== undefined,
			suggestedProperty: propertyFromDescription([...e.descriptions].join(' ') || key)
		};
	});
	const offer: GeologyOffer = {
		files: withLog.map((s) => s.file),
		layers: withLog.reduce((n, s) => n + s.layers.length, 0),
		matched: [...matched],
		unmatched: [...unmatched],
		keys,
		notes,
		errors: withLog.filter((s) => s.error).map((s) => ({ file: s.file, message: s.error! }))
	};
	if (request) {
		const plannedContacts = contactsOf(withLog, soundingsByFile, request);
		const used = new Set(plannedContacts.map((c) => c.unit.toLowerCase()));
		const chosen = [...new Set(request.units.filter((u) => u.unit !== null && used.has(u.unit.toLowerCase())).map((u) => u.unit!))];
		offer.outcome = {
			contacts: plannedContacts.length,
			unitsCreated: chosen.filter((n) => !lower.has(n.toLowerCase())),
			unitsUsed: chosen.filter((n) => lower.has(n.toLowerCase())).map((n) => lower.get(n.toLowerCase())!)
		};
	}
	return offer;
}

/**
 * Writes the contacts of the GEOL logs for the soundings the import wrote, creating the units that do not
 * exist yet (appended below the project's units, shallowest first). A contact's top elevation is the sounding's
 * ground elevation − GEOL_TOP of the unit's first layer at that location; it replaces a contact already there.
 * Runs inside the import's transaction.
 */
export function writeGeologyContacts(
	projectId: string,
	sources: GeologySource[],
	written: WrittenSounding[],
	request: GeologyRequest,
	db: DbOrTx
): { contacts: number; unitsCreated: string[] } {
	const soundingsByFile = new Map<string, ParsedSounding[]>();
	for (const w of written) soundingsByFile.set(w.file, [...(soundingsByFile.get(w.file) ?? []), w.sounding]);
	const planned = contactsOf(sources, soundingsByFile, request);
	if (planned.length === 0) return { contacts: 0, unitsCreated: [] };

	const existing = new Map(db.select({ id: units.id, name: units.name }).from(units).where(eq(units.projectId, projectId)).all().map((u) => [u.name.toLowerCase(), u.id]));
	const depthOf = new Map<string, number[]>();
	for (const c of planned) depthOf.set(c.unit.toLowerCase(), [...(depthOf.get(c.unit.toLowerCase()) ?? []), c.top]);
	const toCreate = [...new Map(planned.filter((c) => !existing.has(c.unit.toLowerCase())).map((c) => [c.unit.toLowerCase(), c])).values()].sort(
		(a, b) => median(depthOf.get(a.unit.toLowerCase())!) - median(depthOf.get(b.unit.toLowerCase())!)
	);
	for (const c of toCreate) {
		const created = createUnit(projectId, { name: c.unit, property: c.property }, db);
		existing.set(c.unit.toLowerCase(), created.id);
	}
	const idOf = new Map(written.map((w) => [w.sounding, w.soundingId]));
	for (const c of planned) {
		const soundingId = idOf.get(c.sounding)!;
		const unitId = existing.get(c.unit.toLowerCase())!;
		const topElevation = c.sounding.groundElevation! - c.top;
		db.insert(contacts)
			.values({ soundingId, unitId, topElevation })
			.onConflictDoUpdate({ target: [contacts.soundingId, contacts.unitId], set: { topElevation, interpolated: false } })
			.run();
	}
	return { contacts: planned.length, unitsCreated: toCreate.map((c) => c.unit) };
}

/** Soil words that make a description clay-like (a rule of our own). */
const CLAY_LIKE = /\b(clay|silt|peat|organic)/i;

function propertyFromDescription(text: string): SimulatedProperty {
	// The principal soil is written in capitals in common logging practice (SAND, CLAY); look there first.
	const principal = /\b(CLAY|SILT|PEAT|SAND|GRAVEL)\b/.exec(text);
	if (principal) return /CLAY|SILT|PEAT/.test(principal[1]) ? 'suRatio' : 'qc1Ncs';
	return CLAY_LIKE.test(text) ? 'suRatio' : 'qc1Ncs';
}

/** One contact to write: the unit's first top (depth, m) at a sounding. */
interface PlannedContact {
	sounding: ParsedSounding;
	unit: string;
	property: SimulatedProperty;
	top: number;
}

function contactsOf(sources: GeologySource[], soundingsByFile: Map<string, ParsedSounding[]>, request: GeologyRequest): PlannedContact[] {
	const choice = new Map(request.units.map((u) => [u.key, u]));
	const out: PlannedContact[] = [];
	for (const src of sources) {
		if (src.error || src.layers.length === 0) continue;
		const logs = groupBy(src.layers, (l) => l.locaId);
		for (const s of soundingsByFile.get(src.file) ?? []) {
			const log = s.meta?.LOCA_ID ? logs.get(s.meta.LOCA_ID) : undefined;
			if (!log || s.groundElevation === undefined) continue;
			const first = new Map<string, PlannedContact>();
			for (const l of log) {
				const c = choice.get(keyOf(l));
				if (!c || c.unit === null) continue;
				const unit = c.unit.trim();
				const prev = first.get(unit.toLowerCase());
				if (!prev || l.top < prev.top) {
					first.set(unit.toLowerCase(), { sounding: s, unit, property: c.property ?? propertyFromDescription(l.description || l.code), top: l.top });
				}
			}
			out.push(...first.values());
		}
	}
	return out;
}

/**
 * Layers of one location's log that repeat a key found higher up, after a layer of another key, and which key
 * they will be read as: with one top per unit, a reading belongs to the key whose first top is the deepest at
 * or above it. Repeats read as their own key (nothing else starts in between) are left out.
 */
function recurrences(log: Ags4GeologyLayer[]): { key: string; top: number; first: number; readAs: string }[] {
	const sorted = [...log].sort((a, b) => a.top - b.top);
	const first = new Map<string, number>();
	const out: { key: string; top: number; first: number; readAs: string }[] = [];
	let previous: string | undefined;
	for (const l of sorted) {
		const k = keyOf(l);
		if (!first.has(k)) first.set(k, l.top);
		else if (k !== previous) {
			let readAs = k;
			let deepest = -Infinity;
			for (const [key, top] of first) if (top <= l.top && top >= deepest) [readAs, deepest] = [key, top];
			if (readAs !== k) out.push({ key: k, top: l.top, first: first.get(k)!, readAs });
		}
		previous = k;
	}
	return out;
}

function groupBy<T>(items: T[], by: (t: T) => string): Map<string, T[]> {
	const out = new Map<string, T[]>();
	for (const item of items) {
		const k = by(item);
		if (!out.has(k)) out.set(k, []);
		out.get(k)!.push(item);
	}
	return out;
}

function median(v: number[]): number {
	const s = [...v].sort((a, b) => a - b);
	const h = s.length >> 1;
	return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}
