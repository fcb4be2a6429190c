/**
 * Compare in headless Chromium against the built server: the demo's uniform baseline beside its grouped
 * stochastic recipe. The value under the cursor on the difference map equals the difference of the two E-types
 * read through the API (the summary endpoint), bit for bit, and each recipe's map reads its own E-type there; a
 * click sets the profile's chainage; a recipe on another grid is refused with the reason.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, launchChromium, signInPage, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');
let browser: Browser;
let page: Page;
let api: HttpSession;
let projectId: string;
let baseline: { id: string; name: string };
let grouped: { id: string; name: string };

const float = (values: (number | null)[]) => Float64Array.from(values, (v) => (v === null ? NaN : v));

async function etype(recipeId: string): Promise<Float64Array> {
	const res = await api.json('GET', `/api/v1/projects/${projectId}/recipes/${recipeId}/summary?stat=mean`);
	expect(res.status).toBe(200);
	return float((await res.json()).values);
}

/**
 * Hovers the plot `testid` at fractions of its canvas; the readout's cell and value (as the page holds it), or
 * null where the readout shows nothing (a cell outside the property's domains).
 */
async function readAt(testid: string, fx: number, fy: number): Promise<{ cell: number; value: number; text: string } | null> {
	const canvas = page.locator(`[data-testid=${testid}-canvas]`);
	await canvas.scrollIntoViewIfNeeded();
	const box = (await canvas.boundingBox())!;
	await page.mouse.move(box.x + box.width * fx, box.y + box.height * fy);
	const readout = page.locator(`[data-testid=${testid}] [data-testid=field-readout]`);
	const shown = await readout
		.waitFor({ timeout: 1500 })
		.then(() => true)
		.catch(() => false);
	if (!shown) return null;
	return { cell: Number(await readout.getAttribute('data-cell')), value: Number(await readout.getAttribute('data-value')), text: (await readout.textContent()) ?? '' };
}

beforeAll(async () => {
	browser = await launchChromium();
	api = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	const { projects } = (await (await api.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	const { recipes } = (await (await api.json('GET', `/api/v1/projects/${projectId}/recipes`)).json()) as { recipes: { id: string; name: string; kind: string }[] };
	baseline = recipes.find((r) => r.kind === 'uniform' && r.name.startsWith('Uniform baseline'))!;
	grouped = recipes.find((r) => r.kind === 'sgs' && /^Sand grouped, \d+ realizations$/.test(r.name))!;
	({ page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1280, height: 800 }));
}, 120_000);
afterAll(async () => {
	await browser?.close();
});

describe('Compare in Chromium', () => {
	it('the difference map’s value under the cursor is the grouped E-type minus the baseline’s, as the API gives them', async () => {
		await page.goto(`/projects/${projectId}/simulations/compare?recipes=${baseline.id},${grouped.id}`);
		// The first time, the server regenerates the stochastic recipe's realizations for its maps.
		await page.locator('[data-testid=difference-map-plot-canvas]').waitFor({ timeout: 240_000 });
		await expect.poll(() => page.locator('[data-testid=difference]').textContent()).toContain(`${grouped.name} minus ${baseline.name}`);
		const [a, b] = await Promise.all([etype(baseline.id), etype(grouped.id)]);
		expect(a.length).toBe(b.length);

		let read = 0;
		const seen = new Set<number>();
		for (const fy of [0.45, 0.6, 0.75, 0.9]) {
			for (const fx of [0.12, 0.3, 0.5, 0.7, 0.88]) {
				const d = await readAt('difference-map-plot', fx, fy);
				if (!d) continue;
				expect(Number.isFinite(a[d.cell]) && Number.isFinite(b[d.cell])).toBe(true);
				// Exactly: the page subtracts the same doubles the API sends (JSON numbers round-trip).
				expect(d.value, `cell ${d.cell}`).toBe(b[d.cell] - a[d.cell]);
				const shown = Number(/difference: (-?[\d.]+)/.exec(d.text)![1]);
				expect(Math.abs(shown - d.value)).toBeLessThanOrEqual(0.01);
				// Each recipe's own map reads its E-type at the same place.
				const left = await readAt('map-0-plot', fx, fy);
				const right = await readAt('map-1-plot', fx, fy);
				expect([left?.cell, right?.cell]).toEqual([d.cell, d.cell]);
				expect([left?.value, right?.value]).toEqual([a[d.cell], b[d.cell]]);
				seen.add(d.cell);
				read++;
			}
		}
		expect(read).toBeGreaterThanOrEqual(8);
		expect(seen.size).toBe(read);
	}, 300_000);

	it('the uniform baseline’s E-type is one value a domain (its P-values averaged), so the difference is the stochastic field less a constant', async () => {
		const [a] = await Promise.all([etype(baseline.id)]);
		const { recipe } = await (await api.json('GET', `/api/v1/projects/${projectId}/recipes/${baseline.id}`)).json();
		const doc = JSON.parse(await (await api.fetch(`/api/v1/projects/${projectId}/recipes/${baseline.id}/recipe.json`)).text());
		const domainOf: number[] = doc.targets.domainRuns.flatMap(([d, n]: [number, number]) => new Array(n).fill(d));
		for (const p of recipe.provenance.domains as { index: number | null; values: number[] }[]) {
			if (p.index === null) continue;
			const cells = new Set(domainOf.flatMap((d, c) => (d === p.index ? [a[c]] : [])));
			expect(cells.size).toBe(1);
			const [only] = cells;
			expect(only).toBeCloseTo(p.values.reduce((s, v) => s + v, 0) / p.values.length, 9);
		}
	});

	it('a click on the difference map sets the profile’s chainage', async () => {
		const canvas = page.locator('[data-testid=difference-map-plot-canvas]');
		await canvas.scrollIntoViewIfNeeded();
		const box = (await canvas.boundingBox())!;
		await page.mouse.click(box.x + box.width * 0.5, box.y + box.height * 0.7);
		await page.locator('[data-testid=difference-map-plot] [data-testid=field-marker]').waitFor({ state: 'attached', timeout: 10_000 });
		expect(await page.locator('[data-testid=map-0-plot] [data-testid=field-marker]').count()).toBe(1);
		const profile = page.locator('[data-testid=compare-profile]');
		await expect.poll(() => profile.locator('h3').textContent()).toMatch(/^Profile at chainage [\d.,]+ m$/);
		// One median line (at least) for each recipe, down the clicked chainage.
		expect(await profile.locator('[data-testid=profile-median]').count()).toBeGreaterThanOrEqual(2);
	});

	it('a third recipe on another grid is refused with the reason, and no maps are drawn', async () => {
		const { zonations } = await (await api.json('GET', `/api/v1/projects/${projectId}/zonations`)).json();
		const z = zonations.find((x: { name: string }) => x.name === 'Sand grouped');
		const res = await api.json('POST', `/api/v1/projects/${projectId}/recipes`, {
			kind: 'uniform',
			name: 'Compare coarse baseline',
			zonationId: z.id,
			grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 25 }, elevation: { from: -12, to: 5, cell: 1 } },
			domains: z.domains.map((d: { id: string }) => ({ domainId: d.id, simulate: true }))
		});
		expect([200, 201]).toContain(res.status);
		const coarse = (await res.json()).recipe;
		await page.reload();
		await page.locator('[data-testid=difference-map-plot-canvas]').waitFor({ timeout: 120_000 });
		await page.locator(`[data-testid=pick][data-recipe="${coarse.id}"]`).check();
		const refusal = page.locator('[data-testid=refusal]');
		await refusal.waitFor({ timeout: 30_000 });
		expect(await refusal.textContent()).toMatch(/must share a grid/);
		expect(await refusal.textContent()).toContain('Compare coarse baseline');
		expect(await page.locator('[data-testid=difference-map-plot-canvas]').count()).toBe(0);
		expect(new URL(page.url()).searchParams.get('recipes')).toBe([baseline.id, grouped.id, coarse.id].join(','));
	});
});
