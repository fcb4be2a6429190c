#!/usr/bin/env node
// `npm test`: each step in order, stopping at the first failure with its exit code.
import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));
const bin = (pkg, file) => join(root, 'node_modules', pkg, file);

const steps = [
	['svelte-kit sync', [bin('@sveltejs/kit', 'svelte-kit.js'), 'sync']],
	['svelte-check', [bin('svelte-check', 'bin/svelte-check'), '--tsconfig', './tsconfig.json']],
	['unit tests', [bin('vitest', 'vitest.mjs'), 'run', '--project', 'unit']],
	['build', [bin('vite', 'bin/vite.js'), 'build']],
	['integration and end-to-end tests', [bin('vitest', 'vitest.mjs'), 'run', '--project', 'server']]
];

for (const [name, args] of steps) {
	console.log(`\n▶ ${name}`);
	const started = Date.now();
	const result = spawnSync(process.execPath, args, { cwd: root, stdio: 'inherit' });
	if (result.status !== 0) {
		console.error(`\n✖ ${name} failed (exit ${result.status ?? result.signal}).`);
		process.exit(result.status ?? 1);
	}
	console.log(`✔ ${name} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
}
console.log('\nAll checks passed.');
