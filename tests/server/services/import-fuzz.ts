/**
 * A seeded generator of CPT uploads for fuzzing the import service, and the harness that runs them:
 * valid GEF, AGS4 and CSV files and malformed ones (truncations, byte flips, wrong encodings, huge and
 * non-finite numbers, shuffled and duplicated lines, odd file names), one to three files an upload. Case `i`
 * of seed `s` depends on nothing else, so any case can be replayed alone. Used by `npm run fuzz` (10 000
 * cases, scripts/fuzz.ts) and by import-fuzz.test.ts (1 000 of them in `npm test`).
 */
import seedrandom from 'seedrandom';
import { count, eq } from 'drizzle-orm';
import { formatAgs4, formatDelimited, formatGef, type DelimitedMapping, type ParsedSounding } from '../../../src/lib/cpt';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { soundings, sourceFiles } from '../../../src/lib/server/db/site-schema';
import { ImportRejected, importSoundings, type ImportRequest, type UploadedFile } from '../../../src/lib/server/services/import';
import { listSoundings } from '../../../src/lib/server/services/soundings';
import { deriveSoundings } from '../../../src/lib/server/services/derived';
import { sectionView } from '../../../src/lib/server/services/stratigraphy';
import { updateSite } from '../../../src/lib/server/services/site';
import { addProject } from './soundings-db';

export const FUZZ_SEED = 'conefield-import-fuzz';

/** The column mapping that fits formatDelimited's header. */
export const FUZZ_MAPPING: DelimitedMapping = {
	id: 'sounding',
	depth: 'depth (m)',
	qc: 'qc (MPa)',
	fs: 'fs (kPa)',
	u2: 'u2 (kPa)',
	units: { depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' },
	x: { column: 'easting (m)' },
	y: { column: 'northing (m)' },
	groundElevation: { column: 'ground elevation (m)' },
	areaRatio: { column: 'area ratio' }
};

type Rng = () => number;

function sounding(rng: Rng, id: string): ParsedSounding {
	const n = 1 + Math.floor(rng() * (rng() < 0.1 ? 2000 : 200));
	const step = [0.01, 0.02, 0.05][Math.floor(rng() * 3)];
	const depth = Float64Array.from({ length: n }, (_, i) => Math.round((i + 1) * step * 1000) / 1000);
	return {
		id,
		x: 500000 + rng() * 1000,
		y: 4180000 + rng() * 1000,
		groundElevation: -5 + rng() * 20,
		areaRatio: 0.75 + rng() * 0.1,
		depth,
		qc: depth.map(() => (rng() < 0.03 ? NaN : 200 + rng() * 20000)),
		fs: depth.map(() => rng() * 200),
		u2: depth.map(() => rng() * 400 - 50)
	};
}

const NUMBER_TOKENS = ['1e160', '-1e160', '1e308', '-1e308', '1e400', '-1e400', '9'.repeat(400), 'NaN', 'Infinity', '-Infinity', 'inf', '0x10', '1,5', '', '-', '1e-400', '4e15', '-0'];
const NOISE = ['', ' ', ',', ';', '\t', '"', '""', '\n', '\r\n', '#EOH=', '#COLUMN= 99', '#ZID= 0, 1e300, 0', '#XYID= 0, 1e160, 1e160, 0, 0', '"DATA"', '"GROUP","LOCA"', '\u0000', '\uFFFD', 'é', '\u200b', '=', '#'];
const NAMES = ['cpt.gef', 'CPT 1.GEF', 'site.ags', 'data.csv', 'x.tsv', 'toString', 'constructor', '__proto__', 'hasOwnProperty', 'readme.txt', '', 'a'.repeat(300), 'ünïcode.csv'];

function pick<T>(rng: Rng, xs: readonly T[]): T {
	return xs[Math.floor(rng() * xs.length)];
}

/** One mutation of the text; which and where from the seeded stream. */
function mutateText(rng: Rng, text: string): string {
	const at = Math.floor(rng() * (text.length + 1));
	const lines = () => text.split('\n');
	switch (Math.floor(rng() * 9)) {
		case 0: // truncate
			return text.slice(0, at);
		case 1: // delete a span
			return text.slice(0, at) + text.slice(at + 1 + Math.floor(rng() * 40));
		case 2: // insert noise
			return text.slice(0, at) + pick(rng, NOISE) + text.slice(at);
		case 3: {
			// replace some numbers with huge, tiny or non-finite ones
			let k = 0;
			const every = 1 + Math.floor(rng() * 50);
			return text.replace(/-?\d+\.\d+/g, (m) => (k++ % every === 0 ? pick(rng, NUMBER_TOKENS) : m));
		}
		case 4: {
			// shuffle a block of lines
			const ls = lines();
			const a = Math.floor(rng() * ls.length);
			const b = Math.min(ls.length, a + 1 + Math.floor(rng() * 20));
			const block = ls.slice(a, b);
			for (let i = block.length - 1; i > 0; i--) {
				const j = Math.floor(rng() * (i + 1));
				[block[i], block[j]] = [block[j], block[i]];
			}
			return [...ls.slice(0, a), ...block, ...ls.slice(b)].join('\n');
		}
		case 5: {
			// duplicate a line
			const ls = lines();
			const a = Math.floor(rng() * ls.length);
			ls.splice(a, 0, ls[a]);
			return ls.join('\n');
		}
		case 6: // line endings
			return rng() < 0.5 ? text.replace(/\n/g, '\r\n') : text.replace(/\n/g, '\r');
		case 7: {
			// eastings and northings (six or seven integer digits) made huge, tiny or non-finite
			const token = pick(rng, NUMBER_TOKENS);
			return text.replace(/\b\d{6,7}\.\d+/g, token);
		}
		default: // the header line or the first data line removed
			return lines().filter((_, i) => i !== (rng() < 0.5 ? 0 : 1)).join('\n');
	}
}

/** Byte-level damage and re-encodings. */
function toBytes(rng: Rng, text: string): Uint8Array {
	const r = rng();
	let bytes: Uint8Array;
	if (r < 0.06) {
		// UTF-16LE, with or without its BOM
		const body = Buffer.from(text, 'utf16le');
		bytes = rng() < 0.5 ? Buffer.concat([Buffer.from([0xff, 0xfe]), body]) : body;
	} else if (r < 0.1) bytes = Buffer.from(text.replace(/e/g, 'é'), 'latin1');
	else if (r < 0.13) bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)]);
	else bytes = new TextEncoder().encode(text);
	if (rng() < 0.2) {
		bytes = Uint8Array.from(bytes);
		const flips = 1 + Math.floor(rng() * 8);
		for (let k = 0; k < flips && bytes.length > 0; k++) bytes[Math.floor(rng() * bytes.length)] ^= 1 << Math.floor(rng() * 8);
	}
	if (rng() < 0.02) bytes = Uint8Array.from({ length: Math.floor(rng() * 2000) }, () => Math.floor(rng() * 256));
	return bytes;
}

/** Upload `index` of the seeded stream: files, and options as the upload form would send them. */
export function fuzzCase(index: number, seed = FUZZ_SEED): ImportRequest {
	const rng = seedrandom(`${seed}:${index}`);
	const files: UploadedFile[] = [];
	const nFiles = rng() < 0.8 ? 1 : 2 + Math.floor(rng() * 2);
	for (let f = 0; f < nFiles; f++) {
		const kind = pick(rng, ['gef', 'ags4', 'csv', 'tsv'] as const);
		const group = Array.from({ length: kind === 'gef' ? 1 : 1 + Math.floor(rng() * 3) }, (_, k) => sounding(rng, `F${index}-${f}-${k}`));
		let text =
			kind === 'gef'
				? formatGef(group[0], rng() < 0.5 ? {} : { columnSeparator: ';', recordSeparator: '!' })
				: kind === 'ags4'
					? formatAgs4(group)
					: formatDelimited(group, { delimiter: kind === 'tsv' ? '\t' : ',' });
		const valid = rng() < 0.25;
		if (!valid) {
			const edits = 1 + Math.floor(rng() * 4);
			for (let e = 0; e < edits; e++) text = mutateText(rng, text);
		}
		const ext = kind === 'gef' ? '.gef' : kind === 'ags4' ? '.ags' : kind === 'tsv' ? '.tsv' : '.csv';
		const name = rng() < 0.1 ? pick(rng, NAMES) : `file-${index}-${f}${ext}`;
		files.push({ name, bytes: valid ? new TextEncoder().encode(text) : toBytes(rng, text) });
	}
	const options: Omit<ImportRequest, 'files'> = {};
	const m = rng();
	if (m < 0.7) options.mapping = FUZZ_MAPPING;
	else if (m < 0.85) options.mappings = Object.fromEntries(files.map((f) => [f.name, FUZZ_MAPPING]));
	if (rng() < 0.3) options.defaults = { groundElevation: rng() * 10, areaRatio: 0.8 };
	return { files, ...options };
}

export interface FuzzTally {
	tried: number;
	refused: number;
	accepted: number;
	crashes: number;
	partialWrites: number;
	/** Refusals by the code of each refused file's problem. */
	codes: Record<string, number>;
	/** The first few failures, for replaying with fuzzCase(index). */
	failures: { index: number; kind: 'crash' | 'partial write'; detail: string }[];
}

/** A database with one project per case, each with a section line, so reads project soundings onto it. */
export function fuzzDatabase(): Db {
	return openDatabase(':memory:');
}

function rowsOf(db: Db, projectId: string) {
	const files = db.select({ n: count() }).from(sourceFiles).where(eq(sourceFiles.projectId, projectId)).get()!.n;
	const stored = db.select({ n: count() }).from(soundings).where(eq(soundings.projectId, projectId)).get()!.n;
	return { files, stored };
}

/**
 * Runs cases `from` … `to − 1` through importSoundings, and every accepted upload through the reads that
 * use its soundings (list, derived properties, section). A crash is any exception but ImportRejected, or a
 * refusal that reports an internal error; a partial write is a refused upload that left rows behind, or an
 * accepted one whose stored rows differ from what it reported.
 */
export function runFuzz(from: number, to: number, { seed = FUZZ_SEED, db = fuzzDatabase(), onProgress }: { seed?: string; db?: Db; onProgress?: (done: number) => void } = {}): FuzzTally {
	const tally: FuzzTally = { tried: 0, refused: 0, accepted: 0, crashes: 0, partialWrites: 0, codes: {}, failures: [] };
	const fail = (index: number, kind: 'crash' | 'partial write', detail: string) => {
		if (kind === 'crash') tally.crashes++;
		else tally.partialWrites++;
		if (tally.failures.length < 10) tally.failures.push({ index, kind, detail });
	};
	const log = console.error;
	for (let index = from; index < to; index++) {
		const request = fuzzCase(index, seed);
		const { projectId, userId } = addProject(db, `Fuzz ${index}`);
		updateSite(projectId, { sectionLine: [[500000, 4180000], [501000, 4181000]] }, db);
		tally.tried++;
		let outcome: 'accepted' | 'refused';
		// The service logs internal errors before reporting them; the tally reports them instead.
		console.error = () => {};
		try {
			const result = importSoundings(projectId, userId, request, db);
			outcome = 'accepted';
			const expected = { files: result.files.length, stored: result.files.reduce((n, f) => n + f.soundings.length, 0) };
			const rows = rowsOf(db, projectId);
			if (rows.files !== expected.files || rows.stored !== expected.stored) fail(index, 'partial write', `reported ${JSON.stringify(expected)}, stored ${JSON.stringify(rows)}`);
			listSoundings(projectId, db);
			deriveSoundings(projectId, undefined, db);
			sectionView(projectId, 'qc1Ncs', db);
		} catch (err) {
			if (!(err instanceof ImportRejected)) {
				fail(index, 'crash', err instanceof Error ? (err.stack ?? err.message) : String(err));
				continue;
			}
			outcome = 'refused';
			for (const p of err.problems) tally.codes[p.code] = (tally.codes[p.code] ?? 0) + 1;
			if (err.problems.some((p) => p.code === 'internal')) fail(index, 'crash', err.problems.map((p) => p.message).join('; '));
			const rows = rowsOf(db, projectId);
			if (rows.files !== 0 || rows.stored !== 0) fail(index, 'partial write', `refused, but stored ${JSON.stringify(rows)}`);
		} finally {
			console.error = log;
		}
		tally[outcome]++;
		onProgress?.(tally.tried);
	}
	return tally;
}
