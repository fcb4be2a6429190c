import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { count, eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { contacts, soundings, sourceFiles, units } from '../../../src/lib/server/db/site-schema';
import { fromFloat64Blob } from '../../../src/lib/server/db/float64';
import { ImportRejected, importSoundings, planImport, type UploadedFile } from '../../../src/lib/server/services/import';
import { createUnit, putContact } from '../../../src/lib/server/services/stratigraphy';
import { testProject, type TestProject } from './soundings-db';

const enc = (text: string) => new TextEncoder().encode(text);
const file = (name: string, text: string): UploadedFile => ({ name, bytes: enc(text) });

/** A one-sounding GEF file; `qc` varies the bytes so two files of one name are different files. */
function gef(id: string, qc = 1.5, ground = 2.5): string {
	return (
		`#GEFID= 1, 1, 0\n#TESTID= ${id}\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n` +
		`#COLUMNINFO= 3, MPa, local friction, 3\n#ZID= 0, ${ground}, 0\n#EOH=\n0.10 ${qc} 0.015\n0.20 2.0 0.02\n0.30 2.5 0.021\n`
	);
}

function stored(t: TestProject) {
	const rows = t.db.select({ name: soundings.name, qc: soundings.qc }).from(soundings).where(eq(soundings.projectId, t.projectId)).all();
	return Object.fromEntries(rows.map((r) => [r.name, fromFloat64Blob(r.qc)[0]]));
}

function rejected(run: () => unknown): ImportRejected {
	try {
		run();
	} catch (err) {
		if (err instanceof ImportRejected) return err;
		throw err;
	}
	return expect.fail('expected the upload to be refused');
}

let t: TestProject;
beforeEach(async () => {
	t = await testProject();
});

describe('planImport and importSoundings with clashing sounding names', () => {
	it('planImport names each clash, with the project or another file of the upload, and suggests a free name; it writes nothing', () => {
		importSoundings(t.projectId, t.userId, { files: [file('old.gef', gef('CPT-07'))] }, t.db);
		importSoundings(t.projectId, t.userId, { files: [file('old2.gef', gef('CPT-07 (2)', 1.1))] }, t.db);
		const before = stored(t);
		const plan = planImport(t.projectId, { files: [file('new.gef', gef('CPT-07', 1.6)), file('a.gef', gef('CPT-08')), file('b.gef', gef('CPT-08', 1.7))] }, t.db);
		expect(plan.unresolved).toBe(2);
		expect(plan.soundings.map((s) => [s.file, s.name, s.action, s.finalName])).toEqual([
			['new.gef', 'CPT-07', 'unresolved', null],
			['a.gef', 'CPT-08', 'import', 'CPT-08'],
			['b.gef', 'CPT-08', 'unresolved', null]
		]);
		expect(plan.soundings[0].clash).toMatchObject({ with: 'project', suggestedName: 'CPT-07 (3)', existing: { name: 'CPT-07', readings: 3, sourceFile: 'old.gef' } });
		expect(plan.soundings[0].message).toBe('sounding CPT-07 is already in the project (3 readings from old.gef): skip it, replace, or keep both under a new name');
		expect(plan.soundings[2].clash).toMatchObject({ with: 'upload', otherFile: 'a.gef', suggestedName: 'CPT-08 (2)' });
		expect(stored(t)).toEqual(before);
	});

	it('planImport refuses a file it cannot read (422) in the terms of a check', () => {
		const err = rejected(() => planImport(t.projectId, { files: [file('bad.gef', gef('X').replace('0.20 2.0', '0.20 x'))] }, t.db));
		expect(err.status).toBe(422);
		expect(err.message).toBe("bad.gef: line 10, column cone resistance: 'x' is not a number. Nothing can be imported until this is fixed.");
	});

	it('importSoundings refuses unresolved clashes with 409, the plan beside the problems, and writes nothing', () => {
		const err = rejected(() => importSoundings(t.projectId, t.userId, { files: [file('a.gef', gef('X')), file('b.gef', gef('X', 1.7))] }, t.db));
		expect(err.status).toBe(409);
		expect(err.problems).toEqual([{ file: 'b.gef', code: 'sounding-exists', message: 'b.gef: sounding X is also in a.gef of this upload: skip it, replace, or keep both under a new name' }]);
		expect(err.plan?.unresolved).toBe(1);
		expect(stored(t)).toEqual({});
	});

	it('importSoundings with "skip" leaves the clashing sounding out and keeps the project\'s', () => {
		importSoundings(t.projectId, t.userId, { files: [file('old.gef', gef('CPT-07'))] }, t.db);
		const result = importSoundings(
			t.projectId,
			t.userId,
			{ files: [file('new.gef', gef('CPT-07', 1.6)), file('c.gef', gef('CPT-09'))], clashes: [{ file: 'new.gef', sounding: 'CPT-07', action: 'skip' }] },
			t.db
		);
		// A file all of whose soundings are skipped is not stored at all.
		expect(result.files.map((f) => [f.name, f.soundings.map((s) => s.name)])).toEqual([['c.gef', ['CPT-09']]]);
		expect(stored(t)).toEqual({ 'CPT-07': 1500, 'CPT-09': 1500 });
		expect(t.db.select({ n: count() }).from(sourceFiles).get()!.n).toBe(2);
	});

	it('importSoundings with "replace" overwrites the readings in place: id, contacts and groundwater stay, the old file goes', () => {
		importSoundings(t.projectId, t.userId, { files: [file('old.gef', gef('CPT-07'))] }, t.db);
		const old = t.db.select().from(soundings).get()!;
		t.db.update(soundings).set({ groundwaterElevation: 1.25 }).where(eq(soundings.id, old.id)).run();
		const unit = createUnit(t.projectId, { name: 'Clay' }, t.db);
		putContact(t.projectId, { soundingId: old.id, unitId: unit.id, topElevation: 1.5 }, t.db);
		const plan = planImport(t.projectId, { files: [file('new.gef', gef('CPT-07', 1.6, 2.6))], clashes: [{ file: 'new.gef', sounding: 'CPT-07', action: 'replace' }] }, t.db);
		expect(plan.soundings[0].message).toBe("replaces the project's CPT-07 (3 readings); its id, 1 contacts and groundwater are kept");
		const result = importSoundings(
			t.projectId,
			t.userId,
			{ files: [file('new.gef', gef('CPT-07', 1.6, 2.6))], clashes: [{ file: 'new.gef', sounding: 'CPT-07', action: 'replace' }] },
			t.db
		);
		expect(result.files[0].soundings[0]).toMatchObject({ id: old.id, name: 'CPT-07', action: 'replace' });
		const now = t.db.select().from(soundings).get()!;
		expect(now).toMatchObject({ id: old.id, groundElevation: 2.6, groundwaterElevation: 1.25, sourceFileId: result.files[0].id });
		expect(fromFloat64Blob(now.qc)[0]).toBeCloseTo(1600, 9);
		expect(now.createdAt.getTime()).toBeGreaterThanOrEqual(old.createdAt.getTime());
		expect(t.db.select().from(contacts).all()).toEqual([{ soundingId: old.id, unitId: unit.id, topElevation: 1.5, interpolated: false }]);
		expect(t.db.select({ name: sourceFiles.name }).from(sourceFiles).all()).toEqual([{ name: 'new.gef' }]);
	});

	it('importSoundings with "rename" keeps both, under the suggested or a chosen name, and refuses a name that is taken', () => {
		importSoundings(t.projectId, t.userId, { files: [file('old.gef', gef('CPT-07'))] }, t.db);
		const suggested = importSoundings(
			t.projectId,
			t.userId,
			{ files: [file('new.gef', gef('CPT-07', 1.6))], clashes: [{ file: 'new.gef', sounding: 'CPT-07', action: 'rename' }] },
			t.db
		);
		expect(suggested.files[0].soundings[0]).toMatchObject({ name: 'CPT-07 (2)', action: 'rename', originalName: 'CPT-07' });
		const taken = rejected(() =>
			importSoundings(
				t.projectId,
				t.userId,
				{ files: [file('third.gef', gef('CPT-07', 1.8))], clashes: [{ file: 'third.gef', sounding: 'CPT-07', action: 'rename', name: 'CPT-07 (2)' }] },
				t.db
			)
		);
		expect(taken.status).toBe(409);
		expect(taken.problems[0].message).toContain('the new name CPT-07 (2) is taken too');
		importSoundings(
			t.projectId,
			t.userId,
			{ files: [file('third.gef', gef('CPT-07', 1.8))], clashes: [{ file: 'third.gef', sounding: 'CPT-07', action: 'rename', name: 'CPT-07b' }] },
			t.db
		);
		expect(stored(t)).toEqual({ 'CPT-07': 1500, 'CPT-07 (2)': 1600, 'CPT-07b': 1800 });
	});

	it('importSoundings with "replace" between two files of one upload keeps the later one', () => {
		const result = importSoundings(
			t.projectId,
			t.userId,
			{ files: [file('a.gef', gef('X')), file('b.gef', gef('X', 1.7))], clashes: [{ file: 'b.gef', sounding: 'X', action: 'replace' }] },
			t.db
		);
		expect(result.files.map((f) => f.name)).toEqual(['b.gef']);
		expect(stored(t)).toEqual({ X: 1700 });
	});

	it('importSoundings refuses a clash and a bad choice alike, and a refusal with a good choice beside it writes nothing', () => {
		const err = rejected(() =>
			importSoundings(
				t.projectId,
				t.userId,
				{
					files: [file('a.gef', gef('X')), file('b.gef', gef('X', 1.7)), file('c.gef', gef('Y')), file('d.gef', gef('Y', 1.9))],
					clashes: [{ file: 'b.gef', sounding: 'X', action: 'rename', name: 'Y' }]
				},
				t.db
			)
		);
		expect(err.problems.map((p) => p.file)).toEqual(['b.gef', 'd.gef']);
		expect(stored(t)).toEqual({});
		expect(t.db.select({ n: count() }).from(units).get()!.n).toBe(0);
	});
});
