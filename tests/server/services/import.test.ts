import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import seedrandom from 'seedrandom';
import { count, eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { parseAgs4, parseGef, type DelimitedMapping } from '../../../src/lib/cpt/index';
import { fromFloat64Blob } from '../../../src/lib/server/db/float64';
import { soundings, sourceFiles } from '../../../src/lib/server/db/site-schema';
import { ImportRejected, importSoundings, previewUpload, type UploadedFile } from '../../../src/lib/server/services/import';
import { expectAbsClose, expectSameBits } from '../../asserts';
import { addProject, testProject, type TestProject } from './soundings-db';

const enc = (text: string) => new TextEncoder().encode(text);
const file = (name: string, text: string): UploadedFile => ({ name, bytes: enc(text) });
const DEMO = join(import.meta.dirname, '..', '..', '..', 'static', 'demo');
const demoFile = (path: string): UploadedFile => ({ name: path.split('/').pop()!, bytes: new Uint8Array(readFileSync(join(DEMO, path))) });

// Exact unit definitions (NIST Special Publication 811): 1 ft = 0.3048 m; 1 tsf = 2000 lbf/ft², 1 lb = 0.45359237 kg, gn = 9.80665 m/s².
const FT = 0.3048;
const TSF_KPA = (2000 * 0.45359237 * 9.80665) / (FT * FT) / 1000;

function gef({ qcUnit = 'MPa', zid = '#ZID= 0, 2.5, 0\n', row2 = '0.20 2.000 0.0200' } = {}): string {
	return (
		'#GEFID= 1, 1, 0\n#TESTID= G-1\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n' +
		`#COLUMNINFO= 2, ${qcUnit}, cone resistance, 2\n#COLUMNINFO= 3, MPa, local friction, 3\n` +
		`#XYID= 0, 1000.5, 2000.25, 0, 0\n${zid}#EOH=\n0.10 1.500 0.0150\n${row2}\n0.30 2.500 0.0210\n`
	);
}

const CSV = 'cpt,depth_ft,qc_tsf,fs_tsf,u2_tsf,easting,northing,ground\nA,1,10,0.1,0,100,200,5\nA,2,20,0.2,0.1,100,200,5\nB,1,30,0.3,0,150,210,6\n';
const MAPPING: DelimitedMapping = {
	id: 'cpt',
	depth: 'depth_ft',
	qc: 'qc_tsf',
	fs: 'fs_tsf',
	u2: 'u2_tsf',
	units: { depth: 'ft', qc: 'tsf', fs: 'tsf', u2: 'tsf' },
	x: { column: 'easting' },
	y: { column: 'northing' },
	groundElevation: { column: 'ground' }
};

function stored(t: TestProject) {
	return {
		files: t.db.select({ n: count() }).from(sourceFiles).where(eq(sourceFiles.projectId, t.projectId)).get()!.n,
		soundings: t.db.select({ n: count() }).from(soundings).where(eq(soundings.projectId, t.projectId)).get()!.n
	};
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

describe('importSoundings(projectId, userId, request)', () => {
	it('importSoundings stores a GEF file with its bytes and SHA-256, and its sounding as Float64 BLOBs in m and kPa', () => {
		const text = gef();
		const result = importSoundings(t.projectId, t.userId, { files: [file('g1.gef', text)] }, t.db);
		expect(result.files).toHaveLength(1);
		expect(result.files[0]).toMatchObject({ name: 'g1.gef', format: 'gef', soundings: [{ name: 'G-1', readings: 3 }] });
		const src = t.db.select().from(sourceFiles).where(eq(sourceFiles.id, result.files[0].id)).get()!;
		expect(Buffer.from(src.bytes).toString('utf8')).toBe(text);
		expect(src.sha256).toBe(createHash('sha256').update(text).digest('hex'));
		expect(src.size).toBe(enc(text).byteLength);
		expect(src.uploadedBy).toBe(t.userId);
		const row = t.db.select().from(soundings).where(eq(soundings.id, result.files[0].soundings[0].id)).get()!;
		const parsed = parseGef(text, { file: 'g1.gef' })[0];
		expectSameBits(fromFloat64Blob(row.depth), parsed.depth, 'depth');
		expectSameBits(fromFloat64Blob(row.qc), parsed.qc, 'qc');
		expectSameBits(fromFloat64Blob(row.fs), parsed.fs, 'fs');
		// qc 1.5 MPa = 1500 kPa (exact decimal scaling, tolerance for the binary product).
		expectAbsClose(fromFloat64Blob(row.qc)[0], 1500, 1e-9, 'qc[0]');
		expect(row.u2).toBeNull();
		expect(row).toMatchObject({ name: 'G-1', x: 1000.5, y: 2000.25, groundElevation: 2.5, readings: 3, maxDepth: 0.3 });
		expectAbsClose(row.maxQc, 2500, 1e-9, 'maxQc');
		// No #MEASUREMENTVAR 3 in the file: the common-practice default a = 0.8.
		expect(row.areaRatio).toBe(0.8);
	});

	it('importSoundings splits delimited text by its id column and honours ft and tsf (exact unit definitions)', () => {
		const result = importSoundings(t.projectId, t.userId, { files: [file('two.csv', CSV)], mapping: MAPPING }, t.db);
		expect(result.files[0].soundings.map((s) => [s.name, s.readings])).toEqual([
			['A', 2],
			['B', 1]
		]);
		const a = t.db.select().from(soundings).where(eq(soundings.name, 'A')).get()!;
		expectAbsClose(fromFloat64Blob(a.depth)[1], 2 * FT, 1e-12, 'depth ft → m');
		expectAbsClose(fromFloat64Blob(a.qc)[1], 20 * TSF_KPA, 1e-9, 'qc tsf → kPa');
		expectAbsClose(fromFloat64Blob(a.fs)[1], 0.2 * TSF_KPA, 1e-9, 'fs tsf → kPa');
		expectAbsClose(fromFloat64Blob(a.u2!)[1], 0.1 * TSF_KPA, 1e-9, 'u2 tsf → kPa');
		expect(a).toMatchObject({ x: 100, y: 200, groundElevation: 5 });
		const src = t.db.select().from(sourceFiles).where(eq(sourceFiles.id, result.files[0].id)).get()!;
		expect(src.format).toBe('delimited');
		expect(src.mapping).toEqual(MAPPING);
	});

	it('importSoundings takes a per-file mapping before the upload-wide one', () => {
		const other = 'name;z_m;cone_MPa;sleeve_kPa;gl\nS-9;0,5;1,2;10;3\nS-9;1,0;1,4;11;3\n';
		const result = importSoundings(
			t.projectId,
			t.userId,
			{
				files: [file('two.csv', CSV), file('semi.csv', other)],
				mapping: MAPPING,
				mappings: { 'semi.csv': { id: 'name', depth: 'z_m', qc: 'cone_MPa', fs: 'sleeve_kPa', units: { depth: 'm', qc: 'MPa', fs: 'kPa' }, groundElevation: { column: 'gl' } } }
			},
			t.db
		);
		expect(result.files.map((f) => f.soundings.map((s) => s.name))).toEqual([['A', 'B'], ['S-9']]);
		const s9 = t.db.select().from(soundings).where(eq(soundings.name, 'S-9')).get()!;
		// Decimal commas with a semicolon delimiter: 1,4 MPa = 1400 kPa.
		expectAbsClose(fromFloat64Blob(s9.qc)[1], 1400, 1e-9, 'qc');
	});

	it('importSoundings reads every demo format: 25 GEF files, the AGS4 file and the CSV with the guessed mapping', () => {
		const gefs = Array.from({ length: 25 }, (_, i) => demoFile(`gef/LV-${String(i + 1).padStart(2, '0')}.gef`));
		const g = importSoundings(t.projectId, t.userId, { files: gefs }, t.db);
		expect(g.files.flatMap((f) => f.soundings)).toHaveLength(25);

		const p2 = addProject(t.db, 'AGS');
		const agsFile = demoFile('levee-cpt.ags');
		const a = importSoundings(p2.projectId, p2.userId, { files: [agsFile] }, t.db);
		const names = a.files[0].soundings.map((s) => s.name);
		expect(names).toEqual(parseAgs4(new TextDecoder().decode(agsFile.bytes)).map((s) => s.id));
		expect(names).toHaveLength(25);

		const p3 = addProject(t.db, 'CSV');
		const csv = demoFile('levee-cpt.csv');
		const { guess } = previewUpload(csv);
		const c = importSoundings(p3.projectId, p3.userId, { files: [csv], mapping: guess as DelimitedMapping }, t.db);
		expect(c.files[0].soundings.map((s) => s.name)).toEqual(names);

		// The same readings whichever format they came in (written to 1 kPa for qc, 0.1 kPa for fs and u2).
		for (const name of ['LV-01', 'LV-13', 'LV-25']) {
			const rows = [t.projectId, p2.projectId, p3.projectId].map(
				(pid) => t.db.select().from(soundings).where(eq(soundings.projectId, pid)).all().find((r) => r.name === name)!
			);
			const [qg, qa, qcsv] = rows.map((r) => fromFloat64Blob(r.qc));
			expect(qg.length).toBe(qa.length);
			for (let i = 0; i < qg.length; i++) {
				expectAbsClose(qa[i], qg[i], 1e-6, `${name} qc AGS vs GEF`);
				expectAbsClose(qcsv[i], qg[i], 1e-6, `${name} qc CSV vs GEF`);
			}
			expect(rows.map((r) => r.groundElevation)).toEqual([rows[0].groundElevation, rows[0].groundElevation, rows[0].groundElevation]);
		}
	});
});

describe('importSoundings refuses bad files whole, naming file, line and column', () => {
	const cases: { kind: string; files: UploadedFile[]; mapping?: DelimitedMapping; status: number; code: string; line?: number; column?: string }[] = [
		{ kind: 'a non-numeric cell', files: [file('bad.gef', gef({ row2: '0.20 abc 0.0200' }))], status: 422, code: 'not-a-number', line: 11, column: 'cone resistance' },
		{ kind: 'an unknown unit', files: [file('psi.gef', gef({ qcUnit: 'psi' }))], status: 422, code: 'unknown-unit', line: 5, column: 'cone resistance' },
		{ kind: 'depth not increasing', files: [file('down.gef', gef({ row2: '0.05 2.000 0.0200' }))], status: 422, code: 'depth-not-increasing', line: 11, column: 'penetration length' },
		{
			kind: 'a missing required column',
			files: [file('nofs.csv', 'cpt,depth_ft,qc_tsf\nA,1,10\n')],
			mapping: MAPPING,
			status: 422,
			code: 'missing-column',
			line: 1,
			column: 'fs_tsf'
		},
		{ kind: 'a non-numeric CSV cell', files: [file('x.csv', CSV.replace('A,2,20', 'A,2,twenty'))], mapping: MAPPING, status: 422, code: 'not-a-number', line: 3, column: 'qc_tsf' },
		{ kind: 'an empty file', files: [file('empty.gef', '')], status: 422, code: 'empty-file', line: 1 },
		// The PNG signature holds two line feeds before its first NUL byte, so the NUL is on line 3.
		{ kind: 'a binary file', files: [{ name: 'photo.csv', bytes: new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]) }], mapping: MAPPING, status: 422, code: 'binary-file', line: 3 },
		{ kind: 'a file over 50 MB', files: [{ name: 'huge.csv', bytes: new Uint8Array(50 * 1024 * 1024 + 1).fill(32) }], mapping: MAPPING, status: 413, code: 'file-too-large' },
		{ kind: 'a GEF file without ground elevation', files: [file('noz.gef', gef({ zid: '' }))], status: 422, code: 'missing-value', column: 'ZID' }
	];
	for (const c of cases) {
		it(`importSoundings refuses ${c.kind} (${c.status} ${c.code}) and stores nothing`, () => {
			const err = rejected(() => importSoundings(t.projectId, t.userId, { files: c.files, mapping: c.mapping }, t.db));
			expect(err.status).toBe(c.status);
			expect(err.problems).toHaveLength(1);
			const p = err.problems[0];
			expect(p).toMatchObject({ file: c.files[0].name, code: c.code });
			expect(p.line).toBe(c.line);
			expect(p.column).toBe(c.column);
			expect(p.message.startsWith(`${c.files[0].name}: `)).toBe(true);
			if (c.line !== undefined) expect(p.message).toContain(`line ${c.line}`);
			expect(err.message).toContain('Nothing was imported');
			expect(stored(t)).toEqual({ files: 0, soundings: 0 });
		});
	}

	it('importSoundings stores nothing from an upload when one of its files is bad', () => {
		const err = rejected(() =>
			importSoundings(t.projectId, t.userId, { files: [file('good.gef', gef()), file('bad.gef', gef({ row2: '0.20 abc 0.0200' }))] }, t.db)
		);
		expect(err.status).toBe(422);
		expect(err.problems.map((p) => p.file)).toEqual(['bad.gef']);
		expect(err.message).toBe('1 of 2 files were refused; nothing was imported.');
		expect(stored(t)).toEqual({ files: 0, soundings: 0 });
	});

	it('importSoundings lists every refused file of an upload', () => {
		const err = rejected(() => importSoundings(t.projectId, t.userId, { files: [file('a.gef', ''), file('b.gef', gef({ qcUnit: 'psi' }))] }, t.db));
		expect(err.problems.map((p) => [p.file, p.code])).toEqual([
			['a.gef', 'empty-file'],
			['b.gef', 'unknown-unit']
		]);
	});

	it('importSoundings asks for a mapping when delimited text comes without one', () => {
		const err = rejected(() => importSoundings(t.projectId, t.userId, { files: [file('two.csv', CSV)] }, t.db));
		expect(err.problems[0]).toMatchObject({ file: 'two.csv', code: 'missing-column' });
		expect(err.problems[0].message).toContain('column mapping');
	});

	it('importSoundings uses the upload fallback ground elevation for a GEF file without #ZID', () => {
		const result = importSoundings(t.projectId, t.userId, { files: [file('noz.gef', gef({ zid: '' }))], defaults: { groundElevation: 1.25 } }, t.db);
		const row = t.db.select().from(soundings).where(eq(soundings.id, result.files[0].soundings[0].id)).get()!;
		expect(row.groundElevation).toBe(1.25);
	});
});

describe('importSoundings recognises what is already in the project (409)', () => {
	it('importSoundings refuses a re-upload of the same bytes as already imported', () => {
		importSoundings(t.projectId, t.userId, { files: [file('g1.gef', gef())] }, t.db);
		const err = rejected(() => importSoundings(t.projectId, t.userId, { files: [file('renamed.gef', gef())] }, t.db));
		expect(err.status).toBe(409);
		expect(err.problems[0]).toMatchObject({ file: 'renamed.gef', code: 'already-imported' });
		expect(err.problems[0].message).toContain('already imported (as g1.gef');
		expect(stored(t)).toEqual({ files: 1, soundings: 1 });
	});

	it('importSoundings refuses the same file twice in one upload', () => {
		const err = rejected(() => importSoundings(t.projectId, t.userId, { files: [file('a.gef', gef()), file('b.gef', gef())] }, t.db));
		expect(err.status).toBe(409);
		expect(err.problems[0].message).toBe('b.gef: the same file as a.gef in this upload');
		expect(stored(t)).toEqual({ files: 0, soundings: 0 });
	});

	it('importSoundings refuses a sounding whose name is taken, from another file or in the same upload', () => {
		importSoundings(t.projectId, t.userId, { files: [file('g1.gef', gef())] }, t.db);
		const changed = gef({ row2: '0.20 2.100 0.0200' });
		const err = rejected(() => importSoundings(t.projectId, t.userId, { files: [file('g1-v2.gef', changed)] }, t.db));
		expect(err.status).toBe(409);
		expect(err.problems[0]).toMatchObject({ code: 'sounding-exists' });
		expect(err.problems[0].message).toContain('sounding G-1 is already in the project');
	});

	it('importSoundings accepts the same file in another project', () => {
		importSoundings(t.projectId, t.userId, { files: [file('g1.gef', gef())] }, t.db);
		const other = addProject(t.db, 'Other');
		expect(importSoundings(other.projectId, other.userId, { files: [file('g1.gef', gef())] }, t.db).files).toHaveLength(1);
	});
});

describe('previewUpload(file)', () => {
	it('previewUpload(file) returns the header, the first rows and a guessed mapping of the demo CSV', () => {
		const preview = previewUpload(demoFile('levee-cpt.csv'), 5);
		expect(preview.headers.slice(0, 5)).toEqual(['sounding', 'depth (m)', 'qc (MPa)', 'fs (kPa)', 'u2 (kPa)']);
		expect(preview.rows).toHaveLength(5);
		expect(preview.guess).toMatchObject({ id: 'sounding', depth: 'depth (m)', qc: 'qc (MPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)' });
		expect(preview.guess.units).toMatchObject({ depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' });
	});

	it('previewUpload(file) refuses an empty file with 422 naming it', () => {
		const err = rejected(() => previewUpload(file('e.csv', ' \n')));
		expect(err.status).toBe(422);
		expect(err.problems[0]).toMatchObject({ file: 'e.csv', code: 'empty-file', line: 1 });
	});
});

describe('importSoundings under random and truncated input (fuzz)', () => {
	it('importSoundings either imports or refuses with a file problem, never crashes (seeded, 150 cases)', () => {
		const rng = seedrandom('import-fuzz');
		const sources = [demoFile('gef/LV-07.gef'), demoFile('levee-cpt.ags'), file('two.csv', CSV)];
		let imported = 0;
		let refused = 0;
		for (let k = 0; k < 150; k++) {
			const src = sources[k % sources.length];
			let bytes: Uint8Array;
			const mode = Math.floor(rng() * 3);
			if (mode === 0) bytes = src.bytes.slice(0, Math.floor(rng() * src.bytes.length));
			else if (mode === 1) {
				bytes = src.bytes.slice(0, Math.min(src.bytes.length, 4096));
				for (let j = 0; j < 8; j++) bytes[Math.floor(rng() * bytes.length)] = Math.floor(rng() * 256);
			} else bytes = Uint8Array.from({ length: Math.floor(rng() * 512) }, () => Math.floor(rng() * 256));
			const target = addProject(t.db, `fuzz ${k}`);
			try {
				importSoundings(target.projectId, target.userId, { files: [{ name: src.name, bytes }], mapping: MAPPING, defaults: { groundElevation: 0 } }, t.db);
				imported++;
			} catch (err) {
				expect(err).toBeInstanceOf(ImportRejected);
				const problem = (err as ImportRejected).problems[0];
				expect(problem.file).toBe(src.name);
				expect(problem.code).not.toBe('internal');
				refused++;
			}
		}
		expect(imported + refused).toBe(150);
		expect(refused).toBeGreaterThan(0);
	});
});
