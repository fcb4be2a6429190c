// The README and DEVELOPERS.md stay true about what the tree holds: every JSON endpoint is in the API table,
// every folder of src/lib in the layout table.
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

function servers(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
		e.isDirectory() ? servers(join(dir, e.name)) : e.name === '+server.ts' ? [dir] : []
	);
}

describe('README.md and DEVELOPERS.md', () => {
	it('the README\'s API table names every endpoint under src/routes/api (route [param] as :param)', () => {
		const readme = readFileSync('README.md', 'utf8');
		const endpoints = servers('src/routes/api')
			.map((d) => '/' + relative('src/routes', d).split('/').join('/'))
			.filter((p) => !p.includes('[...'))
			.map((p) => p.replace(/\[(\w+)\]/g, ':$1'));
		expect(endpoints.length).toBeGreaterThan(20);
		for (const e of endpoints) expect(readme, e).toContain(`| \`${e}\` |`);
	});

	it('DEVELOPERS.md\'s layout table names every folder of src/lib and src/lib/server', () => {
		const developers = readFileSync('DEVELOPERS.md', 'utf8');
		for (const base of ['src/lib', 'src/lib/server']) {
			for (const e of readdirSync(base, { withFileTypes: true })) {
				if (e.isDirectory()) expect(developers, `${base}/${e.name}/`).toContain(`| \`${base}/${e.name}/\` |`);
			}
		}
	});
});
