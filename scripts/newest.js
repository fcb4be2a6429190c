// Newest modification time under a path, for the scripts that build only when their sources changed.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

/**
 * Newest modification time under a path (0 when missing).
 * @param {string} path
 * @returns {number}
 */
export function newest(path) {
	if (!existsSync(path)) return 0;
	const stat = statSync(path);
	if (!stat.isDirectory()) return stat.mtimeMs;
	let latest = stat.mtimeMs;
	for (const entry of readdirSync(path)) latest = Math.max(latest, newest(join(path, entry)));
	return latest;
}
