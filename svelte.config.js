import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		alias: { $workers: 'workers' },
		// The origin check is src/lib/server/csrf.ts, run from hooks.server.ts: it lets bearer-token API
		// requests through and answers refusals in the API's error shape.
		csrf: { trustedOrigins: ['*'] }
	}
};

export default config;
