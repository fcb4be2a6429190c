/**
 * End to end in headless Chromium on the seeded demo project: an analyst opens the section and changes its
 * exaggeration, picks a contact by clicking a trace, edits a contact in the table, defines a zonation, opens
 * both demo zonations and reads a domain's CDFs and statistics. Demo data changed here is put back.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, launchChromium, signInPage } from '../setup';

const baseUrl = inject('baseUrl');
let browser: Browser;
let context: BrowserContext;
let page: Page;
let demoId: string;

interface ContactJson {
	soundingId: string;
	soundingName: string;
	unitId: string;
	topElevation: number;
}

beforeAll(async () => {
	browser = await launchChromium();
	({ context, page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1440, height: 1000 }));
	const res = await page.request.get('/api/v1/projects');
	demoId = ((await res.json()) as { projects: { id: string; name: string }[] }).projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
});
afterAll(async () => {
	await context?.close();
	await browser?.close();
});

const api = (path: string) => `/api/v1/projects/${demoId}${path}`;
async function contacts(): Promise<ContactJson[]> {
	return ((await (await page.request.get(api('/contacts'))).json()) as { contacts: ContactJson[] }).contacts;
}
async function unitId(name: string): Promise<string> {
	const { units } = (await (await page.request.get(api('/units'))).json()) as { units: { id: string; name: string }[] };
	return units.find((u) => u.name === name)!.id;
}
async function restore(c: ContactJson): Promise<void> {
	const res = await page.request.put(api('/contacts'), { data: { soundingId: c.soundingId, unitId: c.unitId, topElevation: c.topElevation } });
	expect(res.status()).toBe(200);
}

describe('stratigraphy pages (Chromium)', () => {
	it('the section draws every demo sounding and states its vertical exaggeration, which the control changes', async () => {
		await page.goto(`/projects/${demoId}/stratigraphy/section`);
		await expect.poll(() => page.getByTestId('section-trace').count(), { timeout: 30_000 }).toBe(25);
		expect(await page.getByTestId('section-exaggeration').textContent()).toBe('Vertical exaggeration 10×');
		expect(await page.getByTestId('section-contact').count()).toBeGreaterThan(3);
		expect(await page.getByTestId('section-boundary').count()).toBe(1);
		await page.locator('select[name="exaggeration"]').selectOption('5');
		await expect.poll(() => page.getByTestId('section-exaggeration').textContent()).toBe('Vertical exaggeration 5×');
	});

	it('hovering a trace shows the sounding, the value and the unit under the cursor', async () => {
		const trace = page.locator('[data-testid="section-trace"][data-sounding="LV-05"] line');
		const box = (await trace.boundingBox())!;
		await page.mouse.move(box.x + 3, box.y + box.height * 0.8);
		const text = await page.getByTestId('section-readout').textContent();
		expect(text).toContain('LV-05');
		expect(text).toContain('qc1Ncs');
		expect(text).toContain('Dense sand');
	});

	it('an analyst picks the top of the dense sand at LV-05 by clicking its trace', async () => {
		const dense = await unitId('Dense sand');
		const before = (await contacts()).find((c) => c.soundingName === 'LV-05' && c.unitId === dense)!;
		await page.locator('select[name="pick-unit"]').selectOption(dense);
		const trace = page.locator('[data-testid="section-trace"][data-sounding="LV-05"] line');
		const box = (await trace.boundingBox())!;
		await page.mouse.click(box.x + 4, box.y + box.height * 0.75);
		await expect.poll(() => page.getByRole('status').first().textContent(), { timeout: 15_000 }).toMatch(/Top of Dense sand at LV-05 set to/);
		const shown = Number((await page.getByRole('status').first().textContent())!.match(/set to (-?[\d.]+)/)![1]);
		const after = (await contacts()).find((c) => c.soundingName === 'LV-05' && c.unitId === dense)!;
		expect(after.topElevation).toBe(shown);
		expect(after.topElevation).not.toBe(before.topElevation);
		await restore(before);
	});

	it('an analyst edits a contact in the table and it is saved', async () => {
		await page.goto(`/projects/${demoId}/stratigraphy`);
		const dense = await unitId('Dense sand');
		const before = (await contacts()).find((c) => c.soundingName === 'LV-01' && c.unitId === dense)!;
		const input = page.getByLabel('Top of Dense sand at LV-01');
		await input.waitFor();
		expect(Number(await input.inputValue())).toBe(before.topElevation);
		await input.fill('-6.25');
		await input.press('Tab');
		await expect.poll(() => page.getByTestId('contacts-table').getByRole('status').textContent()).toContain('LV-01 · Dense sand');
		expect((await contacts()).find((c) => c.soundingName === 'LV-01' && c.unitId === dense)!.topElevation).toBe(-6.25);
		await restore(before);
	});

	it('an analyst defines a zonation and opens both demo zonations with their mapping', async () => {
		const editor = page.getByTestId('zonations-editor');
		await editor.locator('input[name="new-zonation"]').fill('E2E one per unit');
		await editor.getByRole('button', { name: 'Create zonation' }).click();
		await expect.poll(() => editor.getByTestId('zonation-detail').getAttribute('data-zonation')).toBe('E2E one per unit');
		// One domain per unit, and one per zone of the split sand: 3 + 2.
		expect(await editor.getByTestId('domain-row').count()).toBe(5);
		await editor.getByRole('tab', { name: /Sand split at channel/ }).click();
		await expect.poll(() => editor.getByTestId('zonation-detail').getAttribute('data-zonation')).toBe('Sand split at channel');
		expect(await editor.getByLabel('Domain of Point-bar sand — West').locator('option:checked').textContent()).toBe('Point-bar sand west');
		await editor.getByRole('tab', { name: /Sand grouped/ }).click();
		await expect.poll(() => editor.getByTestId('zonation-detail').getAttribute('data-zonation')).toBe('Sand grouped');
		expect(await editor.getByLabel('Domain of Point-bar sand — East').locator('option:checked').textContent()).toBe('Point-bar sand');
		const { zonations } = (await (await page.request.get(api('/zonations'))).json()) as { zonations: { id: string; name: string }[] };
		const mine = zonations.find((z) => z.name === 'E2E one per unit')!;
		expect((await page.request.delete(api(`/zonations/${mine.id}`))).status()).toBe(204);
	});

	it("the domains page shows each domain's CDFs and statistics, with the caution", async () => {
		await page.goto(`/projects/${demoId}/stratigraphy/domains`);
		expect(await page.getByRole('note').textContent()).toContain('licensed engineer');
		const west = page.locator('[data-testid="domain-card"][data-domain="Point-bar sand west"]');
		await west.getByTestId('domain-stats').waitFor({ timeout: 60_000 });
		const nWest = Number(await west.locator('[data-stat="n"]').textContent());
		expect(nWest).toBeGreaterThan(100);
		const p50 = Number(await west.locator('[data-stat="p50"]').textContent());
		expect(p50).toBeGreaterThan(40);
		expect(p50).toBeLessThan(140);
		expect(await west.getByTestId('cdf-sounding').count()).toBeGreaterThan(5);
		expect(await west.getByTestId('cdf-pooled').count()).toBe(1);
		expect(await west.getByTestId('decluster-scan').count()).toBe(1);
		const east = page.locator('[data-testid="domain-card"][data-domain="Point-bar sand east"]');
		await east.getByTestId('domain-stats').waitFor({ timeout: 60_000 });
		const nEast = Number(await east.locator('[data-stat="n"]').textContent());
		expect(Number(await east.locator('[data-stat="p50"]').textContent())).toBeGreaterThan(p50);

		await page.getByRole('tab', { name: 'Sand grouped' }).click();
		const grouped = page.locator('[data-testid="domain-card"][data-domain="Point-bar sand"]');
		await grouped.getByTestId('domain-stats').waitFor({ timeout: 60_000 });
		expect(Number(await grouped.locator('[data-stat="n"]').textContent())).toBe(nWest + nEast);
	});
});
