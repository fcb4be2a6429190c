#!/usr/bin/env node
// `npm test`: each step in order, stopping at the first failure with its exit code. The browser the
// end-to-end tests need is checked first (and installed when this machine can), so a missing one stops
// the run at once with the command that fixes it rather than after minutes of other steps.
import { spawnSync } from 'node:child_process';
import { accessSync, constants } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureChromium } from './chromium.js';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));
const bin = (pkg, file) => join(root, 'node_modules', pkg, file);

const steps = [
	['svelte-kit sync', [bin('@sveltejs/kit', 'svelte-kit.js'), 'sync']],
	['svelte-check', [bin('svelte-check', 'bin/svelte-check'), '--tsconfig', './tsconfig.json', '--fail-on-warnings']],
	['unit tests', [bin('vitest', 'vitest.mjs'), 'run', '--project', 'unit']],
	['build', [bin('vite', 'bin/vite.js'), 'build']],
	['build the queue worker', [join(root, 'scripts', 'build-worker.js')]],
	['integration and end-to-end tests', [bin('vitest', 'vitest.mjs'), 'run', '--project', 'server']]
];

if (!ensureChromium()) process.exit(1);

// The queue's tests (tests/queue) start their own Redis: Debian's redis-server, or the binary REDIS_SERVER names.
const redisServer = process.env.REDIS_SERVER || '/usr/bin/redis-server';
try {
	accessSync(redisServer, constants.X_OK);
} catch {
	console.error(
		`The queue's tests start Redis from ${redisServer}, which is missing. Install Debian's (as .ci/run does):\n\n  sudo apt-get update && sudo apt-get install -y --no-install-recommends redis-server\n\nor set REDIS_SERVER to a redis-server binary, then run npm test again.`
	);
	process.exit(1);
}

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
