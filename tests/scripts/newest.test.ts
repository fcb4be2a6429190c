/** scripts/newest.js: the newest modification time under a path, which decides whether npm start / npm run worker rebuild. */
import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { newest } from '../../scripts/newest.js';

const dir = mkdtempSync(join(tmpdir(), 'conefield-newest-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('newest(path)', () => {
	it('is the latest mtime of any file or folder below the path, 0 for a missing path', () => {
		mkdirSync(join(dir, 'a', 'b'), { recursive: true });
		writeFileSync(join(dir, 'a', 'old.txt'), 'x');
		writeFileSync(join(dir, 'a', 'b', 'new.txt'), 'y');
		const t = (s: number) => new Date(Date.UTC(2026, 0, 1, 0, 0, s));
		for (const p of [dir, join(dir, 'a'), join(dir, 'a', 'b')]) utimesSync(p, t(1), t(1));
		utimesSync(join(dir, 'a', 'old.txt'), t(2), t(2));
		utimesSync(join(dir, 'a', 'b', 'new.txt'), t(30), t(30));
		expect(newest(dir)).toBe(t(30).getTime());
		expect(newest(join(dir, 'a', 'old.txt'))).toBe(t(2).getTime());
		expect(newest(join(dir, 'missing'))).toBe(0);
	});
});
