// Storage of sounding readings in SQLite: a row per reading against one Float64 BLOB per column, for
// 25 soundings × 800 readings (the demo's size). Both in a WAL database file, written in one transaction.
import Database from 'better-sqlite3';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BenchCase } from './index';

const SOUNDINGS = 25;
const READINGS = 800;
const REPEATS = 5;

function columns(s: number): Float64Array[] {
	const depth = new Float64Array(READINGS);
	const qc = new Float64Array(READINGS);
	const fs = new Float64Array(READINGS);
	const u2 = new Float64Array(READINGS);
	for (let i = 0; i < READINGS; i++) {
		depth[i] = 0.1 + i * 0.02;
		qc[i] = 1000 + ((s * 7919 + i * 104729) % 20000);
		fs[i] = qc[i] / 100;
		u2[i] = 9.81 * depth[i];
	}
	return [depth, qc, fs, u2];
}

const blobOf = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
const arrayOf = (b: Buffer) => {
	const out = new Float64Array(b.byteLength / 8);
	new Uint8Array(out.buffer).set(b);
	return out;
};

function open(dir: string, name: string): Database.Database {
	const db = new Database(join(dir, name));
	db.pragma('journal_mode = WAL');
	return db;
}

function fileBytes(dir: string, name: string): number {
	let total = 0;
	for (const suffix of ['', '-wal']) {
		try {
			total += statSync(join(dir, name + suffix)).size;
		} catch {
			// no WAL file after a checkpoint
		}
	}
	return total;
}

function rows(dir: string): Record<string, number> {
	const name = 'rows.db';
	const db = open(dir, name);
	db.exec('CREATE TABLE readings (sounding INTEGER NOT NULL, i INTEGER NOT NULL, depth REAL, qc REAL, fs REAL, u2 REAL, PRIMARY KEY (sounding, i)) WITHOUT ROWID');
	const insert = db.prepare('INSERT INTO readings VALUES (?, ?, ?, ?, ?, ?)');
	const select = db.prepare('SELECT depth, qc, fs, u2 FROM readings WHERE sounding = ? ORDER BY i');
	let write = Infinity;
	let read = Infinity;
	for (let r = 0; r < REPEATS; r++) {
		db.exec('DELETE FROM readings');
		const t0 = performance.now();
		db.transaction(() => {
			for (let s = 0; s < SOUNDINGS; s++) {
				const [d, q, f, u] = columns(s);
				for (let i = 0; i < READINGS; i++) insert.run(s, i, d[i], q[i], f[i], u[i]);
			}
		})();
		write = Math.min(write, performance.now() - t0);
		const t1 = performance.now();
		for (let s = 0; s < SOUNDINGS; s++) {
			const all = select.all(s) as { depth: number; qc: number; fs: number; u2: number }[];
			const out = [new Float64Array(all.length), new Float64Array(all.length), new Float64Array(all.length), new Float64Array(all.length)];
			all.forEach((row, i) => {
				out[0][i] = row.depth;
				out[1][i] = row.qc;
				out[2][i] = row.fs;
				out[3][i] = row.u2;
			});
		}
		read = Math.min(read, performance.now() - t1);
	}
	db.pragma('wal_checkpoint(TRUNCATE)');
	db.exec('VACUUM');
	db.close();
	return { writeMs: round(write), readMs: round(read), fileKiB: round(fileBytes(dir, name) / 1024) };
}

function blobs(dir: string): Record<string, number> {
	const name = 'blobs.db';
	const db = open(dir, name);
	db.exec('CREATE TABLE soundings (id INTEGER PRIMARY KEY, depth BLOB NOT NULL, qc BLOB NOT NULL, fs BLOB NOT NULL, u2 BLOB)');
	const insert = db.prepare('INSERT INTO soundings VALUES (?, ?, ?, ?, ?)');
	const select = db.prepare('SELECT depth, qc, fs, u2 FROM soundings WHERE id = ?');
	let write = Infinity;
	let read = Infinity;
	for (let r = 0; r < REPEATS; r++) {
		db.exec('DELETE FROM soundings');
		const t0 = performance.now();
		db.transaction(() => {
			for (let s = 0; s < SOUNDINGS; s++) insert.run(s, ...columns(s).map(blobOf));
		})();
		write = Math.min(write, performance.now() - t0);
		const t1 = performance.now();
		for (let s = 0; s < SOUNDINGS; s++) {
			const row = select.get(s) as { depth: Buffer; qc: Buffer; fs: Buffer; u2: Buffer };
			[row.depth, row.qc, row.fs, row.u2].map(arrayOf);
		}
		read = Math.min(read, performance.now() - t1);
	}
	db.pragma('wal_checkpoint(TRUNCATE)');
	db.exec('VACUUM');
	db.close();
	return { writeMs: round(write), readMs: round(read), fileKiB: round(fileBytes(dir, name) / 1024) };
}

function round(v: number): number {
	return Math.round(v * 100) / 100;
}

function inTempDir(run: (dir: string) => Record<string, number>): () => Record<string, number> {
	return () => {
		const dir = mkdtempSync(join(tmpdir(), 'conefield-bench-'));
		try {
			return { soundings: SOUNDINGS, readings: READINGS, ...run(dir) };
		} finally {
			rmSync(dir, { recursive: true, force: true });
		}
	};
}

const cases: BenchCase[] = [
	{ name: 'soundings-storage/row-per-reading', run: inTempDir(rows) },
	{ name: 'soundings-storage/float64-blobs', run: inTempDir(blobs) }
];
export default cases;
