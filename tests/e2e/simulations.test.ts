/**
 * The Simulations workspace end to end in headless Chromium against the built server: the demo analyst sets up a
 * recipe from the demo (the form's grid preview counts the cells the server then stores), runs 5 realizations in
 * the browser's worker pool, and the page shows them; the value under the cursor equals the server's
 * regeneration of that realization bit for bit (also after switching realizations by keyboard); the E-type the
 * page maps equals the summary endpoint's; and cancel stops the pool (no realization arrives afterwards).
 */
import { createHash } from 'node:crypto';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, launchChromium, signInPage, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');
let browser: Browser;
let page: Page;
let api: HttpSession;
let projectId: string;
let recipeId: string;

const sha = (values: (number | null)[]) => createHash('sha256').update(Buffer.from(Float64Array.from(values, (v) => (v === null ? NaN : v)).buffer)).digest('hex');

async function realization(r: number): Promise<(number | null)[]> {
	return (await (await api.json('GET', `/api/v1/projects/${projectId}/recipes/${recipeId}/realizations/${r}`)).json()).values;
}

/** Hovers the field at fractions of its canvas and returns the readout's cell and value. */
async function readAt(fx: number, fy: number): Promise<{ cell: number; value: string }> {
	await page.locator('[data-testid=field-canvas]').scrollIntoViewIfNeeded();
	const box = (await page.locator('[data-testid=field-canvas]').boundingBox())!;
	await page.mouse.move(box.x + box.width * fx, box.y + box.height * fy);
	const readout = page.locator('[data-testid=field-readout]');
	await readout.waitFor();
	return { cell: Number(await readout.getAttribute('data-cell')), value: (await readout.getAttribute('data-value')) ?? '' };
}

/** Opens the recipe form and types a name, a seed, 5 realizations and a grid of 5 m × 0.5 m cells. */
async function openSetup(name: string, seed: string): Promise<void> {
	await page.goto(`/projects/${projectId}/simulations/new`);
	await page.locator('[data-testid=domain-count]').first().waitFor({ timeout: 60_000 });
	await page.locator('[data-testid=recipe-name]').fill(name);
	await page.locator('[data-testid=seed]').fill(seed);
	await page.locator('[data-testid=realizations]').fill('5');
	await page.locator('[data-testid=chainage-cell]').fill('5');
	await page.locator('[data-testid=elevation-cell]').fill('0.5');
}

beforeAll(async () => {
	browser = await launchChromium();
	api = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	const { projects } = (await (await api.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	({ page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1280, height: 800 }));
}, 120_000);
afterAll(async () => {
	await browser?.close();
});

describe('Simulations in Chromium', () => {
	it('the setup form previews the grid; the recipe it creates has the same cells per domain', async () => {
		await openSetup('Browser five', 'e2e-five');
		await expect.poll(async () => page.locator('[data-testid=grid-counts]').textContent()).toMatch(/^80 × 34 = 2,720 cells/);
		const preview = await page.locator('[data-testid=domain-count]').evaluateAll((els) => els.map((e) => [e.getAttribute('data-domain'), Number(e.getAttribute('data-cells'))]));
		await page.locator('[data-testid=create]').click();
		await page.waitForURL(/simulations\?recipe=/, { timeout: 60_000 });
		recipeId = new URL(page.url()).searchParams.get('recipe')!;
		const { recipe } = await (await api.json('GET', `/api/v1/projects/${projectId}/recipes/${recipeId}`)).json();
		expect(recipe.realizations).toBe(5);
		expect(recipe.provenance.domains.map((d: { name: string; cells: number }) => [d.name, d.cells])).toEqual(preview);
	}, 120_000);

	it('runs 5 realizations in the worker pool; the canvas shows them with the server’s bits', async () => {
		await page.locator('[data-testid=run]').click();
		await page.locator('[data-testid=run-status]').filter({ hasText: '5 of 5 in memory' }).waitFor({ timeout: 120_000 });
		const painted = await page.locator('[data-testid=field-canvas]').evaluate((c: HTMLCanvasElement) => {
			const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
			let n = 0;
			for (let i = 3; i < d.length; i += 4) if (d[i] > 0) n++;
			return n;
		});
		expect(painted).toBeGreaterThan(1000);
		const panel = page.locator('[data-testid=field-panel]');
		expect(await panel.getAttribute('data-values-sha256')).toBe(sha(await realization(0)));
	}, 120_000);

	it('the value under the cursor equals the server’s realization value bit for bit, also after → switches realization', async () => {
		const server0 = await realization(0);
		let compared = 0;
		for (const [fx, fy] of [[0.2, 0.5], [0.5, 0.7], [0.8, 0.35], [0.9, 0.9]]) {
			const { cell, value } = await readAt(fx, fy);
			if (server0[cell] === null) {
				expect(value).toBe('');
				continue;
			}
			expect(value).toBe(String(server0[cell]));
			compared++;
		}
		expect(compared).toBeGreaterThanOrEqual(3);
		await page.locator('[data-testid=field-panel]').focus();
		await page.keyboard.press('ArrowRight');
		await expect.poll(() => page.locator('[data-testid=field-panel]').getAttribute('data-realization')).toBe('1');
		expect(await page.locator('[data-testid=realization-number]').inputValue()).toBe('1');
		const server1 = await realization(1);
		const { cell, value } = await readAt(0.5, 0.7);
		expect(value).toBe(String(server1[cell]));
		expect(await page.locator('[data-testid=field-panel]').getAttribute('data-values-sha256')).toBe(sha(server1));
	}, 120_000);

	it('the E-type the page maps equals the summary endpoint’s, bit for bit', async () => {
		await page.locator('[data-testid=show-mean]').click();
		await expect.poll(() => page.locator('[data-testid=field-panel]').getAttribute('data-mode')).toBe('mean');
		await expect.poll(() => page.locator('[data-testid=field-panel]').getAttribute('data-values-sha256'), { timeout: 30_000 }).not.toBe('');
		const summary = await (await api.json('GET', `/api/v1/projects/${projectId}/recipes/${recipeId}/summary?stat=mean`)).json();
		expect(await page.locator('[data-testid=field-panel]').getAttribute('data-values-sha256')).toBe(sha(summary.values));
		const { cell, value } = await readAt(0.5, 0.7);
		expect(value).toBe(String(summary.values[cell]));
	}, 120_000);

	it('the checks run on the realizations made and give a verdict per domain', async () => {
		await page.locator('[data-testid=run-checks]').click();
		await page.locator('[data-testid=check-domain]').first().waitFor({ timeout: 120_000 });
		expect(await page.locator('[data-testid=check-domain]').count()).toBe(5);
		const levels = await page.locator('[data-testid=verdict]').evaluateAll((els) => els.map((e) => e.getAttribute('data-level')));
		expect(levels.length).toBe(15);
		for (const l of levels) expect(['ok', 'watch', 'off']).toContain(l);
	}, 180_000);

	it('cancel stops the pool: the run says so and no realization arrives afterwards', async () => {
		const { recipes } = await (await api.json('GET', `/api/v1/projects/${projectId}/recipes`)).json();
		const demo = recipes.find((r: { name: string }) => r.name.startsWith('Sand split at channel'));
		await page.goto(`/projects/${projectId}/simulations?recipe=${demo.id}`);
		await page.locator('[data-testid=run]').click();
		await page.locator('[data-testid=run-progress]').waitFor();
		await page.waitForTimeout(500);
		await page.locator('[data-testid=cancel-run]').click();
		const status = page.locator('[data-testid=run-status]');
		await status.filter({ hasText: 'Cancelled' }).waitFor({ timeout: 10_000 });
		const kept = Number(/Cancelled: (\d+) of 20/.exec((await status.textContent()) ?? '')![1]);
		await page.waitForTimeout(6000);
		expect(await status.textContent()).toContain(`Cancelled: ${kept} of 20`);
		expect(await page.locator('[data-testid=run]').textContent()).toMatch(kept === 0 ? /Run 20 realizations/ : new RegExp(`Run the other ${20 - kept}`));
	}, 120_000);

	it('one path for all realizations: the form’s switch puts every domain on a constant path; realizations the browser’s workers replay show the server’s bits', async () => {
		await openSetup('Browser constant', 'e2e-constant');
		await page.locator('[data-testid=constant-paths]').check();
		const paths = page.locator('[data-testid=domain-row] select:has(option[value=random-constant])');
		expect(await paths.evaluateAll((els) => els.map((e) => (e as HTMLSelectElement).value))).toEqual(Array(5).fill('random-constant'));
		await page.locator('[data-testid=create]').click();
		await page.waitForURL(/simulations\?recipe=/, { timeout: 60_000 });
		recipeId = new URL(page.url()).searchParams.get('recipe')!;
		const { recipe } = await (await api.json('GET', `/api/v1/projects/${projectId}/recipes/${recipeId}`)).json();
		expect(recipe.setup.domains.filter((d: { simulate: boolean }) => d.simulate).map((d: { search: { path: string } }) => d.search.path)).toEqual(Array(5).fill('random-constant'));
		await page.locator('[data-testid=run]').click();
		await page.locator('[data-testid=run-status]').filter({ hasText: '5 of 5 in memory' }).waitFor({ timeout: 120_000 });
		// Each worker solves its first realization and replays the next ones from its plan.
		const panel = page.locator('[data-testid=field-panel]');
		for (let r = 0; r < 5; r++) {
			if (r > 0) {
				await panel.focus();
				await page.keyboard.press('ArrowRight');
			}
			await expect.poll(() => panel.getAttribute('data-realization')).toBe(String(r));
			expect(await panel.getAttribute('data-values-sha256'), `realization ${r}`).toBe(sha(await realization(r)));
		}
	}, 180_000);
});
