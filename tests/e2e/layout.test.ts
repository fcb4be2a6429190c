/**
 * The built pages at the two screens practitioners use (1280×800 and 1920×1080), in headless Chromium on the
 * demo project, read only: the units table fits its card, the profiles page shows every selected sounding
 * without a hidden horizontal scroll, adjacent tracks' tick labels stay apart and every trace stays in its
 * track, qc and fs go on log axes, the variography Weights setting and summary agree, and dates read one way.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, launchChromium, signInPage } from '../setup';

const baseUrl = inject('baseUrl');
let browser: Browser;
let context: BrowserContext;
let page: Page;
let demoId: string;
let soundingIds: string[];

beforeAll(async () => {
	browser = await launchChromium();
	({ context, page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1280, height: 800 }));
	const projects = ((await (await page.request.get('/api/v1/projects')).json()) as { projects: { id: string; name: string }[] }).projects;
	demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	const list = ((await (await page.request.get(`/api/v1/projects/${demoId}/soundings`)).json()) as { soundings: { id: string; name: string }[] }).soundings;
	soundingIds = list.slice(0, 5).map((s) => s.id);
});
afterAll(async () => {
	await context?.close();
	await browser?.close();
});

const SCREENS = [
	{ width: 1280, height: 800 },
	{ width: 1920, height: 1080 }
];

describe.each(SCREENS)('at $width×$height', (screen) => {
	beforeAll(async () => {
		await page.setViewportSize(screen);
	});

	it('the units table fits its card: every Save and Delete button and the zone names are inside it', async () => {
		await page.goto(`/projects/${demoId}/stratigraphy`);
		const card = page.getByTestId('units-editor');
		await card.locator('[data-testid="unit-row"]').first().waitFor();
		const fits = await card.evaluate((el) => {
			const box = el.getBoundingClientRect();
			const inside = (q: string) => [...el.querySelectorAll(q)].every((b) => b.getBoundingClientRect().right <= box.right - 1);
			const scroller = el.querySelector('table')!.parentElement!;
			return { buttons: inside('button'), zones: inside('input[aria-label^="Zone names"]'), scroll: scroller.scrollWidth <= scroller.clientWidth };
		});
		expect(fits).toEqual({ buttons: true, zones: true, scroll: true });
	});

	it('the profiles page shows every selected sounding, with no horizontal scroll', async () => {
		await page.goto(`/projects/${demoId}/soundings/profiles?s=${soundingIds.join(',')}`);
		const figures = page.getByTestId('profiles').locator('figure');
		await expect.poll(() => figures.count(), { timeout: 30_000 }).toBe(5);
		const layout = await page.evaluate(() => {
			const holder = document.querySelector('[data-testid="profiles"]')!;
			const right = holder.getBoundingClientRect().right;
			return {
				scroll: holder.scrollWidth <= holder.clientWidth && document.documentElement.scrollWidth <= window.innerWidth,
				inside: [...holder.querySelectorAll('figure')].every((f) => f.getBoundingClientRect().right <= right + 0.5)
			};
		});
		expect(layout).toEqual({ scroll: true, inside: true });
	});

	it('adjacent tracks keep their tick labels apart, and every trace stays inside its track', async () => {
		const problems = await page.getByTestId('profiles').locator('figure svg').evaluateAll((svgs) =>
			svgs.flatMap((svg) => {
				const out: string[] = [];
				const tracks = [...svg.querySelectorAll('g[data-track]')] as SVGGElement[];
				const labels = tracks.map((g) => [...g.querySelectorAll(':scope > text.tabular-nums')].map((t) => (t as SVGTextElement).getBBox()));
				for (let k = 0; k + 1 < tracks.length; k++) {
					const last = labels[k][labels[k].length - 1];
					const first = labels[k + 1][0];
					if (last && first && last.x + last.width > first.x) out.push(`${tracks[k].dataset.track} runs into ${tracks[k + 1].dataset.track}`);
				}
				for (const g of tracks) {
					const frame = g.querySelector('rect')!.getBBox();
					const trace = (g.querySelector('path[fill="none"]') as SVGPathElement).getBBox();
					if (trace.width > 0 && (trace.x < frame.x - 0.5 || trace.x + trace.width > frame.x + frame.width + 0.5)) out.push(`${g.dataset.track} leaves its track`);
				}
				return out;
			})
		);
		expect(problems).toEqual([]);
	});
});

describe('log axes, weights and dates', () => {
	it('qc and fs go on log axes with ticks at powers of ten', async () => {
		await page.setViewportSize({ width: 1280, height: 800 });
		await page.goto(`/projects/${demoId}/soundings/profiles?s=${soundingIds[0]}`);
		const qc = page.getByTestId('profiles').locator('g[data-track="qc"]');
		await qc.waitFor();
		await page.getByTestId('log-axes').check();
		await expect
			.poll(async () => (await qc.locator(':scope > text.tabular-nums').allTextContents()).every((t) => /^(0\.0*1|1|10+|\d+k)$/.test(t)))
			.toBe(true);
	});

	it('the variography Weights setting and the domain summary say the same', async () => {
		await page.goto(`/projects/${demoId}/variography`);
		const summary = page.getByTestId('weights-summary');
		await summary.waitFor({ timeout: 30_000 });
		expect(await page.getByTestId('declustered').inputValue()).toBe('true');
		expect(await summary.textContent()).toMatch(/^declustered \(40 m cells\)$/);
		await page.getByTestId('declustered').selectOption({ label: 'Equal' });
		await expect.poll(() => summary.textContent()).toMatch(/^equal weights \(declustering cell of 40 m not used\)$/);
	});

	it('dates read as day, month in words and year', async () => {
		await page.goto(`/projects/${demoId}`);
		expect(await page.getByText(/created \d{1,2} (Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4}/).count()).toBe(1);
	});
});
