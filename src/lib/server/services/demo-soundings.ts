import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { importSoundings, type ImportResult } from './import';
import type { DbOrTx } from '$lib/server/db/transaction';

/**
 * Where the shipped demo files are: static/demo of the checkout (the server runs from it), else the copy
 * the build puts in build/client/demo.
 */
export function demoDirectory(): string {
	for (const dir of [resolve('static', 'demo'), resolve('build', 'client', 'demo')]) {
		if (existsSync(join(dir, 'gef'))) return dir;
	}
	throw new Error('the demo files (static/demo) are missing');
}

/**
 * Loads the demo soundings into the demo project the way a user would: the 25 GEF files (one per sounding,
 * LV-01 … LV-25) through the import service, as one upload. The CSV and AGS4 copies of the same soundings
 * stay on disk for users to try the other formats in a project of their own.
 */
export function seedDemoSoundings(db: DbOrTx, projectId: string, userId: string | null): ImportResult {
	const dir = join(demoDirectory(), 'gef');
	const files = readdirSync(dir)
		.filter((name) => name.endsWith('.gef'))
		.sort()
		.map((name) => ({ name, bytes: new Uint8Array(readFileSync(join(dir, name))) }));
	return importSoundings(projectId, userId, { files }, db);
}
