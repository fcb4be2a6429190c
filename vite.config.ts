import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { dirname, resolve } from 'node:path';
import { rolldown } from 'rolldown';
import type { Plugin } from 'vite';

/**
 * `import source from './name.worker.ts?server-worker'` gives the worker bundled into one self-contained ES
 * module (its dependencies included), as a string for `new Worker(new URL('data:text/javascript,…'))`. Vite
 * bundles workers only for the browser, and adapter-node keeps no extra server files, so a server worker
 * travels inside the server bundle. The worker must use relative imports (no $lib) and Node built-ins.
 */
function serverWorkers(): Plugin {
	const suffix = '?server-worker';
	return {
		name: 'conefield:server-workers',
		enforce: 'pre',
		async resolveId(source, importer) {
			if (!source.endsWith(suffix) || !importer) return null;
			return resolve(dirname(importer), source.slice(0, -suffix.length)) + suffix;
		},
		async load(id) {
			if (!id.endsWith(suffix)) return null;
			const entry = id.slice(0, -suffix.length);
			const bundle = await rolldown({ input: entry, platform: 'node', logLevel: 'warn' });
			try {
				const { output } = await bundle.generate({ format: 'esm', codeSplitting: false });
				for (const file of await bundle.watchFiles) this.addWatchFile(file);
				return `export default ${JSON.stringify(output[0].code)};`;
			} finally {
				await bundle.close();
			}
		}
	};
}

export default defineConfig({
	plugins: [tailwindcss(), sveltekit(), serverWorkers()],
	worker: { format: 'es' },
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['tests/**/*.test.ts'],
					exclude: ['tests/integration/**', 'tests/e2e/**', 'tests/queue/**'],
					environment: 'node'
				}
			},
			{
				extends: true,
				test: {
					name: 'server',
					include: ['tests/integration/**/*.test.ts', 'tests/e2e/**/*.test.ts', 'tests/queue/**/*.test.ts'],
					environment: 'node',
					fileParallelism: false,
					testTimeout: 120_000,
					hookTimeout: 300_000,
					globalSetup: ['tests/setup/server.ts']
				}
			}
		]
	}
});
