import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { asc, eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { contacts, soundings, units } from '../../../src/lib/server/db/site-schema';
import { ImportRejected, importSoundings, planImport, type UploadedFile } from '../../../src/lib/server/services/import';
import { createUnit } from '../../../src/lib/server/services/stratigraphy';
import { testProject, type TestProject } from './soundings-db';

const AGS = readFileSync(join(import.meta.dirname, '..', '..', 'cpt', 'fixtures', 'ags4', 'geol.ags'));
const ags = (bytes: Uint8Array = AGS): UploadedFile => ({ name: 'geol.ags', bytes });
// Ground levels (LOCA_GL) of the crafted file.
const GL: Record<string, number> = { 'CF-01': 2.4, 'CF-02': 2.1, 'CF-03': 1.95 };

function contactTable(t: TestProject): Record<string, Record<string, number>> {
	const rows = t.db
		.select({ sounding: soundings.name, unit: units.name, top: contacts.topElevation })
		.from(contacts)
		.innerJoin(soundings, eq(soundings.id, contacts.soundingId))
		.innerJoin(units, eq(units.id, contacts.unitId))
		.all();
	const out: Record<string, Record<string, number>> = {};
	for (const r of rows) (out[r.sounding] ??= {})[r.unit] = r.top;
	return out;
}

let t: TestProject;
beforeEach(async () => {
	t = await testProject();
});

describe('importSoundings with an AGS4 GEOL group', () => {
	it('planImport offers each GEOL code with a suggested unit and property, the matched locations and a note on a recurring stratum', () => {
		createUnit(t.projectId, { name: 'alv' }, t.db);
		const plan = planImport(t.projectId, { files: [ags()] }, t.db);
		const offer = plan.geology!;
		expect(offer.files).toEqual(['geol.ags']);
		expect(offer.layers).toBe(13);
		expect(offer.matched.sort()).toEqual(['CF-01', 'CF-02', 'CF-03']);
		expect(offer.unmatched).toEqual(['BH-04']);
		expect(offer.keys.map((k) => [k.key, k.suggestedUnit, k.existingUnit, k.suggestedProperty, k.layers])).toEqual([
			['MG', 'MG', false, 'suRatio', 4],
			// An existing unit of the same name (case aside) is suggested.
			['ALV', 'alv', true, 'suRatio', 5],
			['SND', 'SND', false, 'qc1Ncs', 4]
		]);
		// ALV from 3.60 m lies below SND's first top (3.00 m): it reads as SND. SND again from 4.80 m reads as SND: no note.
		expect(offer.notes).toEqual(['CF-03: ALV again from 3.60 m is read as SND (a unit has one top per sounding: its first, at 1.00 m)']);
		expect(offer.outcome).toBeUndefined();
		expect(t.db.select().from(contacts).all()).toEqual([]);
	});

	it('importSoundings writes top elevation = ground elevation − GEOL_TOP for each imported sounding, creating units in depth order', () => {
		createUnit(t.projectId, { name: 'Soft clay', property: 'suRatio' }, t.db);
		const geology = {
			units: [
				{ key: 'MG', unit: 'Made ground' },
				{ key: 'ALV', unit: 'soft CLAY' },
				{ key: 'SND', unit: 'Sand', property: 'qc1Ncs' as const }
			]
		};
		expect(planImport(t.projectId, { files: [ags()], geology }, t.db).geology!.outcome).toEqual({ contacts: 9, unitsCreated: ['Made ground', 'Sand'], unitsUsed: ['Soft clay'] });
		const result = importSoundings(t.projectId, t.userId, { files: [ags()], geology }, t.db);
		expect(result.geology).toEqual({ contacts: 9, unitsCreated: ['Made ground', 'Sand'] });
		const table = contactTable(t);
		const expected = (loca: string, tops: Record<string, number>) => Object.fromEntries(Object.entries(tops).map(([u, d]) => [u, GL[loca] - d]));
		expect(Object.keys(table).sort()).toEqual(['CF-01', 'CF-02', 'CF-03']);
		for (const [loca, tops] of [
			['CF-01', { 'Made ground': 0, 'Soft clay': 1.2, Sand: 4.5 }],
			['CF-02', { 'Made ground': 0, 'Soft clay': 0.8, Sand: 5.1 }],
			// The first top of a recurring stratum.
			['CF-03', { 'Made ground': 0, 'Soft clay': 1.0, Sand: 3.0 }]
		] as const) {
			const want = expected(loca, tops);
			for (const [u, v] of Object.entries(want)) expect(table[loca][u], `${loca} ${u}`).toBeCloseTo(v, 12);
		}
		const stack = t.db.select({ name: units.name, position: units.position, property: units.property }).from(units).orderBy(asc(units.position)).all();
		// Made ground (median top 0 m) goes above Sand (median top 4.5 m), both below the existing unit.
		expect(stack).toEqual([
			{ name: 'Soft clay', position: 0, property: 'suRatio' },
			{ name: 'Made ground', position: 1, property: 'suRatio' },
			{ name: 'Sand', position: 2, property: 'qc1Ncs' }
		]);
	});

	it('importSoundings leaves out a key mapped to no unit, and writes no contacts without a geology request', async () => {
		importSoundings(t.projectId, t.userId, { files: [ags()], geology: { units: [{ key: 'SND', unit: 'Sand' }, { key: 'MG', unit: null }] } }, t.db);
		expect(Object.values(contactTable(t)).map((c) => Object.keys(c))).toEqual([['Sand'], ['Sand'], ['Sand']]);
		const o = await testProject();
		importSoundings(o.projectId, o.userId, { files: [ags()] }, o.db);
		expect(o.db.select().from(contacts).all()).toEqual([]);
		expect(o.db.select().from(units).all()).toEqual([]);
	});

	it('importSoundings writes contacts only for the soundings it stores, and for a replaced one over its old contacts', () => {
		importSoundings(t.projectId, t.userId, { files: [ags()], geology: { units: [{ key: 'SND', unit: 'Sand' }] } }, t.db);
		const changed = new TextEncoder().encode(new TextDecoder().decode(AGS).replace('"CF-01","0.00","1.20","Made ground: soft brown sandy clay with brick fragments","MG"', '"CF-01","0.00","1.20","Made ground","MG"').replace('"CF-01","4.50","6.00"', '"CF-01","4.00","6.00"'));
		const result = importSoundings(
			t.projectId,
			t.userId,
			{
				files: [{ name: 'geol-v2.ags', bytes: changed }],
				clashes: [
					{ file: 'geol-v2.ags', sounding: 'CF-01', action: 'replace' },
					{ file: 'geol-v2.ags', sounding: 'CF-02', action: 'skip' },
					{ file: 'geol-v2.ags', sounding: 'CF-03', action: 'skip' }
				],
				geology: { units: [{ key: 'SND', unit: 'Sand' }] }
			},
			t.db
		);
		expect(result.geology).toEqual({ contacts: 1, unitsCreated: [] });
		expect(contactTable(t)['CF-01'].Sand).toBeCloseTo(2.4 - 4.0, 12);
		expect(contactTable(t)['CF-02'].Sand).toBeCloseTo(2.1 - 5.1, 12);
	});

	it('importSoundings refuses contacts from a GEOL group it cannot read, naming the line, and writes nothing', () => {
		const bad = new TextEncoder().encode(new TextDecoder().decode(AGS).replace('"CF-02","0.80","5.10"', '"CF-02","deep","5.10"'));
		const plan = planImport(t.projectId, { files: [ags(bad)] }, t.db);
		expect(plan.geology!.errors).toEqual([{ file: 'geol.ags', message: "geol.ags: line 943, column GEOL_TOP: 'deep' is not a number" }]);
		try {
			importSoundings(t.projectId, t.userId, { files: [ags(bad)], geology: { units: [{ key: 'SND', unit: 'Sand' }] } }, t.db);
			expect.fail('expected a refusal');
		} catch (err) {
			expect(err).toBeInstanceOf(ImportRejected);
			expect((err as ImportRejected).status).toBe(422);
			expect((err as ImportRejected).problems[0].message).toContain("column GEOL_TOP: 'deep' is not a number");
		}
		expect(t.db.select().from(soundings).all()).toEqual([]);
		expect(t.db.select().from(units).all()).toEqual([]);
		// Without contacts the CPT data of the same file still go in.
		expect(importSoundings(t.projectId, t.userId, { files: [ags(bad)] }, t.db).files[0].soundings).toHaveLength(3);
	});
});
