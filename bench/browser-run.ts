// "browser-run" (issue 12): the demo's split-zonation recipe run in headless Chromium's worker pool, as a user
// does it: starts the BUILT server (run `npx vite build` first) with the demo on a free loopback port, signs in as
// the demo analyst, opens the recipe on the Simulations page and clicks Run. Prints the milliseconds from the
// click to the first realization on screen (the field painted) and to all 20 in memory. "browser-run:constant":
// the same recipe with every domain on a constant random path, made through the API as a user would in the form.
// Run alone: `npm run bench -- browser-run`.
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { freePort, waitUntilReady } from '../tests/setup/server';
import { DEMO, DEMO_PROJECT_NAME, launchChromium, signInPage, signedInSession } from '../tests/setup';
import type { BenchCase } from './index';

const root = resolve(import.meta.dirname, '..');

async function run(constant: boolean): Promise<Record<string, number>> {
	if (!existsSync(join(root, 'build', 'index.js'))) throw new Error('build first: npx vite build');
	const dataDir = mkdtempSync(join(tmpdir(), 'conefield-bench-'));
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	const server = spawn(process.execPath, [join(root, 'build', 'index.js')], {
		cwd: root,
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: baseUrl, DATABASE_URL: join(dataDir, 'c.db'), DATA_DIR: dataDir, SEED_DEMO: '1', SMTP_URL: '' },
		stdio: 'ignore'
	});
	const browser = await launchChromium();
	try {
		await waitUntilReady(baseUrl, server);
		const api = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
		const { projects } = (await (await api.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
		const projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
		const { recipes } = (await (await api.json('GET', `/api/v1/projects/${projectId}/recipes`)).json()) as { recipes: { id: string; name: string }[] };
		let recipe = recipes.find((r) => r.name.startsWith('Sand split at channel'))!;
		if (constant) {
			const base = `/api/v1/projects/${projectId}/recipes`;
			const { setup } = (await (await api.json('GET', `${base}/${recipe.id}`)).json()).recipe;
			const domains = setup.domains.map((d: { simulate: boolean; search: object }) => (d.simulate ? { ...d, search: { ...d.search, path: 'random-constant' } } : d));
			const made = await api.json('POST', base, { ...setup, name: `${setup.name} (constant path)`, domains });
			if (!made.ok) throw new Error(`recipe not made: ${made.status} ${await made.text()}`);
			recipe = (await made.json()).recipe;
		}

		const { page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1280, height: 800 });
		await page.goto(`/projects/${projectId}/simulations?recipe=${recipe.id}`);
		await page.locator('[data-testid=run]').waitFor();
		const cores = await page.evaluate(() => navigator.hardwareConcurrency);
		// Timed in the page, from the click to the frame after the field holds realization values.
		const firstMs = await page.evaluate(
			() =>
				new Promise<number>((done) => {
					const panel = document.querySelector('[data-testid=field-panel]')!;
					const t0 = performance.now();
					const watch = new MutationObserver(() => {
						if (panel.getAttribute('data-values-sha256')) {
							watch.disconnect();
							requestAnimationFrame(() => done(performance.now() - t0));
						}
					});
					watch.observe(panel, { attributes: true });
					(document.querySelector('[data-testid=run]') as HTMLButtonElement).click();
				})
		);
		const started = Date.now() - firstMs;
		await page.locator('[data-testid=run-status]').filter({ hasText: '20 of 20 in memory' }).waitFor({ timeout: 600_000 });
		const allMs = Date.now() - started;
		return { realizations: 20, cores, firstMs: Math.round(firstMs), allMs: Math.round(allMs) };
	} finally {
		await browser.close();
		server.kill();
		rmSync(dataDir, { recursive: true, force: true });
	}
}

const cases: BenchCase[] = [
	{ name: 'browser-run', run: () => run(false) },
	{ name: 'browser-run:constant', run: () => run(true) }
];
export default cases;
