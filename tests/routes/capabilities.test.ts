// Every project-scoped load, action and endpoint names what it guards by the capability table
// (CAPABILITIES in $lib/server/auth/roles), never by a literal role, so the table is the one place roles are decided.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CAPABILITIES } from '../../src/lib/server/auth/roles';

function files(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []));
}

const guards = files('src/routes').flatMap((file) =>
	[...readFileSync(file, 'utf8').matchAll(/requireProjectRole\(([^;]*?)\);/gs)].map((m) => ({ file, args: m[1] }))
);

describe('route guards', () => {
	it('every requireProjectRole(…) in src/routes takes CAPABILITIES.<capability>', () => {
		expect(guards.length).toBeGreaterThan(40);
		for (const g of guards) {
			const cap = /CAPABILITIES\.(\w+)\s*$/.exec(g.args.trim())?.[1];
			expect(cap, `${g.file}: requireProjectRole(${g.args})`).toBeDefined();
			expect(Object.keys(CAPABILITIES), g.file).toContain(cap);
		}
	});

	it('no route names a project role as a string', () => {
		for (const file of files('src/routes')) {
			expect(readFileSync(file, 'utf8'), file).not.toMatch(/['"](viewer|reviewer|analyst|owner)['"]/);
		}
	});
});
