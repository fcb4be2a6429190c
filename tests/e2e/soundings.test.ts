/**
 * End to end in headless Chromium against the built server: an analyst uploads the demo files in each
 * format through the soundings page (the CSV through the column-mapping step), sees them in the table,
 * gets a refused file explained, opens the profiles and picks a contact in the demo project.
 */
import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, launchChromium } from '../setup';

const baseUrl = inject('baseUrl');
const DEMO_DIR = join(import.meta.dirname, '..', '..', 'static', 'demo');
let browser: Browser;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
	browser = await launchChromium();
	context = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1440, height: 1000 } });
	page = await context.newPage();
	await page.goto('/signin');
	await page.locator('form[action="?/password"] input[name="email"]').fill(DEMO.analyst.email);
	await page.locator('input[name="password"]').fill(DEMO.analyst.password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await page.waitForURL('**/projects');
});
afterAll(async () => {
	await context?.close();
	await browser?.close();
});

async function newProject(name: string): Promise<string> {
	const res = await page.request.post('/api/v1/projects', { data: { name, description: '', lengthUnit: 'm' } });
	expect(res.status()).toBe(201);
	return ((await res.json()) as { project: { id: string } }).project.id;
}

async function openUpload(projectId: string): Promise<void> {
	await page.goto(`/projects/${projectId}/soundings`);
	await page.getByTestId('open-upload').click();
	await page.getByTestId('upload-panel').waitFor();
}

const rows = () => page.getByTestId('sounding-row');

describe('soundings page (Chromium)', () => {
	it('an analyst uploads the demo CSV through the column-mapping step and sees 25 soundings', async () => {
		const id = await newProject('E2E CSV');
		await openUpload(id);
		await page.getByTestId('upload-input').setInputFiles(join(DEMO_DIR, 'levee-cpt.csv'));
		const step = page.getByTestId('mapping-step');
		await step.waitFor();
		// The preview shows the first rows and what each column was mapped to, with its unit.
		await expect.poll(() => step.getByTestId('mapping-preview').locator('tbody tr').count()).toBe(8);
		const head = await step.getByTestId('mapping-preview').locator('thead').textContent();
		expect(head).toContain('qc · MPa');
		expect(head).toContain('depth · m');
		expect(head).toContain('sounding id');
		expect(await step.getByTestId('map-qc').inputValue()).toBe('qc (MPa)');
		expect(await step.getByTestId('unit-fs').inputValue()).toBe('kPa');
		await page.getByTestId('upload-submit').click();
		await expect.poll(() => page.getByTestId('soundings-notice').textContent(), { timeout: 30_000 }).toContain('Imported 25 soundings');
		await expect.poll(() => rows().count()).toBe(25);
		expect(await rows().first().textContent()).toContain('LV-01');
		expect(await rows().first().textContent()).toContain('levee-cpt.csv');
	});

	it('an analyst uploads three GEF files at once, and a bad GEF file is refused with its line and column', async () => {
		const id = await newProject('E2E GEF');
		await openUpload(id);
		await page.getByTestId('upload-input').setInputFiles(['LV-01', 'LV-02', 'LV-03'].map((n) => join(DEMO_DIR, 'gef', `${n}.gef`)));
		await expect.poll(() => page.getByTestId('upload-files').locator('li').count()).toBe(3);
		await page.getByTestId('upload-submit').click();
		await expect.poll(() => rows().count(), { timeout: 30_000 }).toBe(3);

		await page.getByTestId('open-upload').click();
		const bad =
			'#GEFID= 1, 1, 0\n#TESTID= BAD\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n' +
			'#COLUMNINFO= 3, MPa, local friction, 3\n#ZID= 0, 2, 0\n#EOH=\n0.1 1.0 0.01\n0.2 x1 0.01\n';
		await page.getByTestId('upload-input').setInputFiles({ name: 'bad.gef', mimeType: 'text/plain', buffer: Buffer.from(bad) });
		await page.getByTestId('upload-submit').click();
		const errors = page.getByTestId('upload-errors');
		await errors.waitFor();
		const text = await errors.textContent();
		expect(text).toContain('bad.gef: line 10, column cone resistance');
		expect(text).toContain('Nothing was imported');
		expect(await rows().count()).toBe(3);
	});

	it('an analyst uploads the demo AGS4 file and opens the profiles of two selected soundings', async () => {
		const id = await newProject('E2E AGS');
		await openUpload(id);
		await page.getByTestId('upload-input').setInputFiles(join(DEMO_DIR, 'levee-cpt.ags'));
		await page.getByTestId('upload-submit').click();
		await expect.poll(() => rows().count(), { timeout: 30_000 }).toBe(25);
		await page.getByLabel('Select LV-05').check();
		await page.getByLabel('Select LV-06').check();
		await page.getByTestId('open-profiles').click();
		await page.waitForURL(/\/soundings\/profiles\?s=/);
		await page.getByTestId('profile-LV-05').waitFor();
		await page.getByTestId('profile-LV-06').waitFor();
		const tracks = await page.getByTestId('profile-LV-05').locator('[data-track]').evaluateAll((els) => els.map((e) => e.getAttribute('data-track')));
		expect(tracks).toEqual(['qc', 'fs', 'u2', 'Ic', 'property-qc1Ncs', 'property-suRatio']);
		// Hovering shows the values under the cursor.
		const box = (await page.getByTestId('profile-LV-05').locator('svg').boundingBox())!;
		await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
		expect(await page.getByTestId('profile-readout').textContent()).toMatch(/m depth · el\./);
	});

	it('in the demo project the profiles show the contacts, and a click picks a new one', async () => {
		const res = await page.request.get('/api/v1/projects');
		const demoId = ((await res.json()) as { projects: { id: string; name: string }[] }).projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
		const list = ((await (await page.request.get(`/api/v1/projects/${demoId}/soundings`)).json()) as { soundings: { id: string; name: string }[] }).soundings;
		const lv07 = list.find((s) => s.name === 'LV-07')!;
		await page.goto(`/projects/${demoId}/soundings/profiles?s=${lv07.id}`);
		const plot = page.getByTestId('profile-LV-07');
		await plot.waitFor();
		await expect.poll(() => plot.getByTestId('contact-line').count()).toBeGreaterThan(1);

		await page.getByTestId('pick-unit').selectOption({ label: 'Dense sand' });
		await page.getByTestId('pick-toggle').click();
		const box = (await plot.locator('svg').boundingBox())!;
		await page.mouse.click(box.x + box.width / 2, box.y + box.height * 0.8);
		await expect.poll(() => page.getByTestId('pick-status').textContent()).toMatch(/^Top of Dense sand at LV-07: elevation -?\d+\.\d\d m/);
		const contacts = ((await (await page.request.get(`/api/v1/projects/${demoId}/contacts`)).json()) as { contacts: { soundingId: string; topElevation: number }[] }).contacts;
		const status = (await page.getByTestId('pick-status').textContent())!;
		const picked = Number(/elevation (-?\d+\.\d\d)/.exec(status)![1]);
		expect(contacts.some((c) => c.soundingId === lv07.id && Math.abs(c.topElevation - picked) < 1e-9)).toBe(true);
	});
});
