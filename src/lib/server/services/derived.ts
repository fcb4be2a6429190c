import { and, asc, eq, inArray } from 'drizzle-orm';
import { CptFlag, derive, type DerivedSounding, type UnitAtSounding } from '$lib/cpt';
import { getDb } from '$lib/server/db';
import { fromFloat64Blob } from '$lib/server/db/float64';
import { contacts, soundings, units, type Sounding, type Unit } from '$lib/server/db/site-schema';
import type { SimulatedProperty } from '$lib/properties';
import { ServiceError } from '$lib/server/errors';
import type { DbOrTx } from '$lib/server/db/transaction';
import { locateSounding, type SoundingLocation } from '$lib/site';
import { getSite, type SiteView } from './site';

/** A project unit as it stands at one sounding. */
export interface UnitAtSoundingView {
	id: string;
	name: string;
	colour: string;
	position: number;
	property: SimulatedProperty;
	/** Elevation of the unit's top at this sounding; null when the unit is absent here. */
	topElevation: number | null;
}

/** One sounding with its derived properties, ready for profiles, sections and domain samples. */
export interface DerivedSoundingResult {
	sounding: {
		id: string;
		name: string;
		x: number | null;
		y: number | null;
		groundElevation: number;
		areaRatio: number;
		groundwaterElevation: number;
		/** Where the groundwater elevation came from: the sounding's override, the project, or assumed at ground level. */
		groundwaterSource: 'sounding' | 'project' | 'assumed';
	} & SoundingLocation;
	depth: Float64Array;
	qc: Float64Array;
	fs: Float64Array;
	u2: Float64Array | null;
	/** The CPT pipeline's output (elevation, qt, σv, u0, σ'v, Qtn, Fr, Ic, FC, qc1Ncs, CRR, Dr, su, su/σ'v …). */
	derived: DerivedSounding;
	/** The project's units in stacking order (position 0 on top), with their tops at this sounding. */
	units: UnitAtSoundingView[];
	/** Index into `units` of each reading's unit; −1 where no unit applies (no contacts, or above the first unit's top). */
	unit: Int32Array;
	/** CptFlag bitmask per reading (see describeFlags in $lib/cpt). */
	flags: Uint32Array;
	/** Sounding-level remarks a practitioner should see (assumed groundwater, contacts out of order …). */
	warnings: string[];
}

/** Unit weights used where a sounding has no contacts yet (kN/m³; common practice for soft soils). */
const FALLBACK_UNIT: UnitAtSounding = { topElevation: NaN, gammaAbove: 18, gammaBelow: 19 };

/** Extra column names read as a measured fines content (%), case-insensitive. */
const FINES_COLUMN = /^(fc|fines|fines ?content)(\s*\(%\))?$/i;

/** Everything about a project that the derivation of each of its soundings needs, loaded once. */
export interface DeriveContext {
	site: SiteView;
	units: Unit[];
	/** soundingId → unitId → top elevation. */
	contacts: Map<string, Map<string, number>>;
}

export function loadDeriveContext(projectId: string, db: DbOrTx = getDb()): DeriveContext {
	const site = getSite(projectId, db);
	const unitRows = db.select().from(units).where(eq(units.projectId, projectId)).orderBy(asc(units.position), asc(units.name)).all();
	const contactRows = db
		.select({ soundingId: contacts.soundingId, unitId: contacts.unitId, topElevation: contacts.topElevation })
		.from(contacts)
		.innerJoin(units, eq(units.id, contacts.unitId))
		.where(eq(units.projectId, projectId))
		.all();
	const byS = new Map<string, Map<string, number>>();
	for (const c of contactRows) {
		if (!byS.has(c.soundingId)) byS.set(c.soundingId, new Map());
		byS.get(c.soundingId)!.set(c.unitId, c.topElevation);
	}
	return { site, units: unitRows, contacts: byS };
}

/**
 * Derived properties of one sounding of a project: loads it, the project's units, its contacts and the
 * groundwater (project-wide, overridable per sounding), and runs the CPT pipeline ($lib/cpt derive:
 * Lunne et al. 1997; Robertson 2009; Boulanger & Idriss 2014; Idriss & Boulanger 2008).
 * @throws ServiceError 404 when the sounding is not in the project
 */
export function deriveSounding(projectId: string, soundingId: string, db: DbOrTx = getDb()): DerivedSoundingResult {
	const row = db
		.select()
		.from(soundings)
		.where(and(eq(soundings.id, soundingId), eq(soundings.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Sounding not found.');
	return deriveWithContext(row, loadDeriveContext(projectId, db));
}

/**
 * Derived properties of several soundings of a project (all of them when `soundingIds` is omitted), by name.
 * All-sounding results are cached per project until a sounding, unit, contact or site setting changes
 * (deriving the 25 demo soundings takes most of a second); callers must not mutate them.
 */
export function deriveSoundings(projectId: string, soundingIds?: string[], db: DbOrTx = getDb()): DerivedSoundingResult[] {
	const ctx = loadDeriveContext(projectId, db);
	if (soundingIds === undefined) {
		const heads = db
			.select({
				id: soundings.id,
				createdAt: soundings.createdAt,
				x: soundings.x,
				y: soundings.y,
				chainage: soundings.chainage,
				ground: soundings.groundElevation,
				a: soundings.areaRatio,
				gw: soundings.groundwaterElevation,
				n: soundings.readings
			})
			.from(soundings)
			.where(eq(soundings.projectId, projectId))
			.all();
		const key = JSON.stringify([heads, ctx.site, ctx.units, [...ctx.contacts].map(([k, m]) => [k, [...m]])]);
		const hit = cache.get(projectId);
		if (hit && hit.key === key) return hit.results;
		const rows = db.select().from(soundings).where(eq(soundings.projectId, projectId)).orderBy(asc(soundings.name)).all();
		const results = rows.map((r) => deriveWithContext(r, ctx));
		cache.delete(projectId);
		cache.set(projectId, { key, results });
		if (cache.size > CACHE_PROJECTS) cache.delete(cache.keys().next().value!);
		return results;
	}
	const where = and(eq(soundings.projectId, projectId), inArray(soundings.id, soundingIds.length ? soundingIds : ['']));
	const rows = db.select().from(soundings).where(where).orderBy(asc(soundings.name)).all();
	return rows.map((r) => deriveWithContext(r, ctx));
}

/** Projects whose derived soundings are kept (least recently derived dropped first). */
const CACHE_PROJECTS = 4;
const cache = new Map<string, { key: string; results: DerivedSoundingResult[] }>();

/** The derivation of one stored sounding given the project context (pure apart from decoding BLOBs). */
export function deriveWithContext(row: Sounding, ctx: DeriveContext): DerivedSoundingResult {
	const warnings: string[] = [];
	const depth = fromFloat64Blob(row.depth);
	const qc = fromFloat64Blob(row.qc);
	const fs = fromFloat64Blob(row.fs);
	const u2 = row.u2 ? fromFloat64Blob(row.u2) : null;
	const location = locateSounding(ctx.site, row);
	if (location.farOffLine) {
		warnings.push(`${row.name} lies ${Math.abs(location.offset!).toFixed(1)} ${ctx.site.lengthUnit} off the section line.`);
	}

	let groundwaterElevation: number;
	let groundwaterSource: 'sounding' | 'project' | 'assumed';
	if (row.groundwaterElevation != null) {
		groundwaterElevation = row.groundwaterElevation;
		groundwaterSource = 'sounding';
	} else if (ctx.site.groundwaterElevation != null) {
		groundwaterElevation = ctx.site.groundwaterElevation;
		groundwaterSource = 'project';
	} else {
		// Water at the ground surface gives the lowest effective stresses: the cautious assumption until one is entered.
		groundwaterElevation = row.groundElevation;
		groundwaterSource = 'assumed';
		warnings.push('No groundwater elevation is set; the water table is assumed at the ground surface.');
	}

	const tops = ctx.contacts.get(row.id) ?? new Map<string, number>();
	const unitViews: UnitAtSoundingView[] = ctx.units.map((u) => ({
		id: u.id,
		name: u.name,
		colour: u.colour,
		position: u.position,
		property: u.property,
		topElevation: tops.has(u.id) ? tops.get(u.id)! : null
	}));
	// The pipeline wants present units ordered by elevation; contacts that contradict the stacking order
	// are taken as entered (sorted by elevation) and reported, rather than refused.
	const present = unitViews
		.map((u, k) => ({ k, top: u.topElevation }))
		.filter((u): u is { k: number; top: number } => u.top !== null && Number.isFinite(u.top));
	const byElevation = [...present].sort((a, b) => b.top - a.top || a.k - b.k);
	if (byElevation.some((u, i) => u.k !== present[i].k)) {
		warnings.push(`Contacts at ${row.name} are out of stacking order; units are taken in order of their top elevations.`);
	}

	let pipelineUnits: UnitAtSounding[];
	let backToView: number[];
	if (byElevation.length === 0) {
		if (ctx.units.length > 0) warnings.push(`${row.name} has no contacts yet; default unit weights (18/19 kN/m³) are used.`);
		pipelineUnits = [{ ...FALLBACK_UNIT, topElevation: row.groundElevation }];
		backToView = [-1];
	} else {
		pipelineUnits = byElevation.map(({ k, top }) => {
			const u = ctx.units[k];
			return { topElevation: top, gammaAbove: u.gammaAbove, gammaBelow: u.gammaBelow, Nkt: u.nkt, CFC: u.cfc };
		});
		backToView = byElevation.map(({ k }) => k);
	}

	const fc = finesColumn(row.extras);
	const derived = derive(
		{ depth, qc, fs, u2: u2 ?? undefined, groundElevation: row.groundElevation, areaRatio: row.areaRatio },
		{ units: pipelineUnits, groundwaterElevation, fc: fc && fc.length === depth.length ? fc : undefined }
	);
	const unit = new Int32Array(depth.length);
	for (let i = 0; i < unit.length; i++) {
		unit[i] = derived.flags[i] & CptFlag.aboveFirstUnit ? -1 : backToView[derived.unit[i]];
	}

	return {
		sounding: {
			id: row.id,
			name: row.name,
			x: row.x,
			y: row.y,
			groundElevation: row.groundElevation,
			areaRatio: row.areaRatio,
			groundwaterElevation,
			groundwaterSource,
			...location
		},
		depth,
		qc,
		fs,
		u2,
		derived,
		units: unitViews,
		unit,
		flags: derived.flags,
		warnings
	};
}

/** A numeric column for JSON: NaN and ±Infinity become null (JSON has no such numbers). */
export function jsonColumn(values: ArrayLike<number>): (number | null)[] {
	const out: (number | null)[] = new Array(values.length);
	for (let i = 0; i < values.length; i++) out[i] = Number.isFinite(values[i]) ? values[i] : null;
	return out;
}

/** The derived arrays of a result as plain JSON columns (NaN → null), keyed as in DerivedSounding; readings start … end. */
export function derivedJson(result: DerivedSoundingResult, start = 0, end = result.depth.length): Record<string, (number | null)[]> {
	const out: Record<string, (number | null)[]> = {};
	for (const [key, values] of Object.entries(result.derived)) {
		if (key === 'unit' || key === 'flags') continue;
		out[key] = jsonColumn((values as Float64Array).subarray(start, end));
	}
	return out;
}

function finesColumn(extras: Record<string, string> | null): Float64Array | null {
	if (!extras) return null;
	for (const [name, encoded] of Object.entries(extras)) {
		if (FINES_COLUMN.test(name.trim())) return fromFloat64Blob(Buffer.from(encoded, 'base64'));
	}
	return null;
}
