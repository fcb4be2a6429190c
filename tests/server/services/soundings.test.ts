import { count, eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { parseGef } from '../../../src/lib/cpt/index';
import { soundings, sourceFiles } from '../../../src/lib/server/db/site-schema';
import { ServiceError } from '../../../src/lib/server/errors';
import { importSoundings, type UploadedFile } from '../../../src/lib/server/services/import';
import { updateSite } from '../../../src/lib/server/services/site';
import { deleteSounding, getSounding, listSoundings } from '../../../src/lib/server/services/soundings';
import { expectAbsClose, expectSameBits } from '../../asserts';
import { addProject, testProject, type TestProject } from './soundings-db';

const file = (name: string, text: string): UploadedFile => ({ name, bytes: new TextEncoder().encode(text) });

function gef(id: string, x: number, y: number, qc = ['1.500', '2.000', '2.500']): string {
	return (
		`#GEFID= 1, 1, 0\n#TESTID= ${id}\n#COLUMN= 4\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n` +
		`#COLUMNINFO= 3, kPa, local friction, 3\n#COLUMNINFO= 4, kPa, pore pressure u2, 6\n#COLUMNVOID= 3, -9999\n` +
		`#XYID= 0, ${x}, ${y}, 0, 0\n#ZID= 0, 3, 0\n#MEASUREMENTVAR= 3, 0.75, -, net area quotient\n#EOH=\n` +
		`0.10 ${qc[0]} 15 0\n0.20 ${qc[1]} -9999 1.5\n0.30 ${qc[2]} 21 3\n`
	);
}

const thrown = (run: () => unknown): ServiceError => {
	try {
		run();
	} catch (err) {
		if (err instanceof ServiceError) return err;
		throw err;
	}
	return expect.fail('expected a ServiceError');
};

let t: TestProject;
beforeEach(async () => {
	t = await testProject();
});

describe('listSoundings(projectId)', () => {
	it('listSoundings lists soundings in natural order with extent, maximum qc and source file', () => {
		importSoundings(t.projectId, t.userId, { files: [file('s10.gef', gef('S-10', 10, 0)), file('s2.gef', gef('S-2', 2, 0, ['1.000', '4.250', '3.000']))] }, t.db);
		const list = listSoundings(t.projectId, t.db);
		expect(list.map((s) => s.name)).toEqual(['S-2', 'S-10']);
		expect(list[0]).toMatchObject({ readings: 3, maxDepth: 0.3, areaRatio: 0.75, groundElevation: 3, x: 2, y: 0, sourceFile: { name: 's2.gef', format: 'gef' } });
		expectAbsClose(list[0].maxQc, 4250, 1e-9, 'maxQc');
	});

	it('listSoundings projects easting/northing onto the section line once one is set, and flags soundings far off it', () => {
		importSoundings(t.projectId, t.userId, { files: [file('a.gef', gef('A', 30, 4)), file('b.gef', gef('B', 60, -40))] }, t.db);
		expect(listSoundings(t.projectId, t.db).map((s) => [s.chainage, s.chainageSource])).toEqual([
			[null, 'none'],
			[null, 'none']
		]);
		// A line due east from (0, 0): chainage = x, offset = −y (positive to the right), by construction.
		updateSite(t.projectId, { sectionLine: [[0, 0], [100, 0]], offLineTolerance: 25 }, t.db);
		const [a, b] = listSoundings(t.projectId, t.db);
		expectAbsClose(a.chainage!, 30, 1e-12, 'A chainage');
		expectAbsClose(Math.abs(a.offset!), 4, 1e-12, 'A |offset|');
		expect([a.farOffLine, b.farOffLine]).toEqual([false, true]);
		expect(a.chainageSource).toBe('projected');
	});

	it('listSoundings is empty for a project without soundings and never shows another project’s', () => {
		importSoundings(t.projectId, t.userId, { files: [file('a.gef', gef('A', 0, 0))] }, t.db);
		expect(listSoundings(addProject(t.db, 'Empty').projectId, t.db)).toEqual([]);
	});
});

describe('getSounding(projectId, soundingId)', () => {
	it('getSounding decodes the readings bit for bit as imported, voids as NaN', () => {
		const text = gef('A', 0, 0);
		const id = importSoundings(t.projectId, t.userId, { files: [file('a.gef', text)] }, t.db).files[0].soundings[0].id;
		const s = getSounding(t.projectId, id, t.db);
		const parsed = parseGef(text)[0];
		expectSameBits(s.columns.depth, parsed.depth, 'depth');
		expectSameBits(s.columns.qc, parsed.qc, 'qc');
		expectSameBits(s.columns.fs, parsed.fs, 'fs');
		expectSameBits(s.columns.u2!, parsed.u2!, 'u2');
		expect(Number.isNaN(s.columns.fs[1])).toBe(true);
		expect(s.name).toBe('A');
	});

	it('getSounding keeps extra columns of delimited text by name', () => {
		const csv = 'depth,qc,fs,FC\n1,2,20,35\n2,3,30,\n';
		const mapping = { depth: 'depth', qc: 'qc', fs: 'fs', extra: ['FC'], units: { depth: 'm' as const, qc: 'MPa' as const, fs: 'kPa' as const }, groundElevation: { value: 1 } };
		const id = importSoundings(t.projectId, t.userId, { files: [file('one.csv', csv)], mapping }, t.db).files[0].soundings[0].id;
		const s = getSounding(t.projectId, id, t.db);
		expect(s.name).toBe('one');
		expect(Object.keys(s.columns.extras)).toEqual(['FC']);
		expectSameBits(s.columns.extras.FC, [35, NaN], 'FC');
		expect(s.columns.u2).toBeNull();
	});

	it('getSounding answers 404 for a sounding of another project or an unknown id', () => {
		const id = importSoundings(t.projectId, t.userId, { files: [file('a.gef', gef('A', 0, 0))] }, t.db).files[0].soundings[0].id;
		expect(thrown(() => getSounding(addProject(t.db, 'Other').projectId, id, t.db)).status).toBe(404);
		expect(thrown(() => getSounding(t.projectId, 'no-such-id', t.db)).status).toBe(404);
	});
});

describe('deleteSounding(projectId, soundingId)', () => {
	const countFiles = () => t.db.select({ n: count() }).from(sourceFiles).where(eq(sourceFiles.projectId, t.projectId)).get()!.n;

	it('deleteSounding keeps the source file while other soundings of it remain, and removes it with the last one', () => {
		const csv = 'id,depth,qc,fs\nA,1,2,20\nB,1,3,30\n';
		const mapping = { id: 'id', depth: 'depth', qc: 'qc', fs: 'fs', units: { depth: 'm' as const, qc: 'MPa' as const, fs: 'kPa' as const }, groundElevation: { value: 0 } };
		const upload = { files: [file('ab.csv', csv)], mapping };
		const [a, b] = importSoundings(t.projectId, t.userId, upload, t.db).files[0].soundings;
		deleteSounding(t.projectId, a.id, t.db);
		expect(listSoundings(t.projectId, t.db).map((s) => s.name)).toEqual(['B']);
		expect(countFiles()).toBe(1);
		deleteSounding(t.projectId, b.id, t.db);
		expect(countFiles()).toBe(0);
		// With its file gone, the same bytes import again.
		expect(importSoundings(t.projectId, t.userId, upload, t.db).files[0].soundings).toHaveLength(2);
	});

	it('deleteSounding answers 404 for another project’s sounding and leaves it in place', () => {
		const id = importSoundings(t.projectId, t.userId, { files: [file('a.gef', gef('A', 0, 0))] }, t.db).files[0].soundings[0].id;
		expect(thrown(() => deleteSounding(addProject(t.db, 'Other').projectId, id, t.db)).status).toBe(404);
		expect(t.db.select({ n: count() }).from(soundings).get()!.n).toBe(1);
	});
});
