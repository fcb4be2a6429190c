import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	worker: { format: 'es' },
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['tests/**/*.test.ts'],
					exclude: ['tests/integration/**', 'tests/e2e/**'],
					environment: 'node'
				}
			},
			{
				extends: true,
				test: {
					name: 'server',
					include: ['tests/integration/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
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
