/**
 * End to end in headless Chromium against the built server: an analyst uploads the demo files in each
 * format through the soundings page (the CSV through the column-mapping step), checking each upload before
 * importing it, sees them in the table, gets a refused file explained, imports a GEOL log's contacts, settles
 * a taken sounding name, downloads the readings, opens the profiles and picks a contact in the demo project.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, launchChromium, signInPage } from '../setup';

const baseUrl = inject('baseUrl');
const DEMO_DIR = join(import.meta.dirname, '..', '..', 'static', 'demo');
const FIXTURES = join(import.meta.dirname, '..', 'cpt', 'fixtures');
let browser: Browser;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
	browser = await launchChromium();
	({ context, page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1440, height: 1000 }));
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

/** The upload's two steps: check what it will do (nothing written), then import. */
async function checkThenImport(): Promise<void> {
	await page.getByTestId('upload-submit').click();
	await expect.poll(() => page.getByTestId('upload-submit').textContent(), { timeout: 30_000 }).toMatch(/^Import \d+ sounding/);
	expect(await page.getByTestId('upload-status').textContent()).toMatch(/will be imported/);
	await page.getByTestId('upload-submit').click();
}

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
		await checkThenImport();
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
		await checkThenImport();
		await expect.poll(() => rows().count(), { timeout: 30_000 }).toBe(3);

		await page.getByTestId('open-upload').click();
		const bad =
			'#GEFID= 1, 1, 0\n#TESTID= BAD\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n' +
			'#COLUMNINFO= 3, MPa, local friction, 3\n#ZID= 0, 2, 0\n#EOH=\n0.1 1.0 0.01\n0.2 x1 0.01\n';
		await page.getByTestId('upload-input').setInputFiles({ name: 'bad.gef', mimeType: 'text/plain', buffer: Buffer.from(bad) });
		// The check already reads the file: it is refused before anything could be written.
		await page.getByTestId('upload-submit').click();
		const errors = page.getByTestId('upload-errors');
		await errors.waitFor();
		const text = await errors.textContent();
		expect(text).toContain('bad.gef: line 10, column cone resistance');
		expect(text).toContain('Nothing can be imported until this is fixed.');
		expect(await page.locator('[data-file="bad.gef"] [data-testid="file-status"]').textContent()).toBe('refused');
		expect(await rows().count()).toBe(3);
	});

	it('an analyst imports a GEOL log\'s contacts, reads the notes, and settles a taken name per clash', async () => {
		const id = await newProject('E2E clashes');
		await openUpload(id);
		await page.getByTestId('upload-input').setInputFiles([join(FIXTURES, 'ags4', 'geol.ags'), join(FIXTURES, 'gef', 'negative-penetration.gef')]);
		await page.getByTestId('upload-submit').click();
		const geology = page.getByTestId('geology-review');
		await geology.waitFor();
		expect(await page.getByTestId('upload-notes').textContent()).toContain('PS-114 (negative-penetration.gef): Penetration length is recorded as negative numbers');
		await geology.locator('[data-key="ALV"] [data-testid="geology-unit"]').fill('Soft clay');
		await geology.locator('[data-key="MG"] [data-testid="geology-unit"]').fill('');
		expect(await page.getByTestId('upload-status').textContent()).toBe('4 soundings (940 readings) will be imported, with contacts from the GEOL log.');
		await page.getByTestId('upload-submit').click();
		const notice = page.getByTestId('soundings-notice');
		await expect.poll(() => notice.textContent(), { timeout: 30_000 }).toContain('Wrote 6 contacts from the GEOL log; new units: Soft clay, SND.');
		expect(await notice.textContent()).toContain('PS-114: Penetration length is recorded as negative numbers growing downward');
		expect(await rows().count()).toBe(4);

		// The same sounding name again, from a revised file: nothing can be imported until the clash is settled.
		await page.getByTestId('open-upload').click();
		const revised = readFileSync(join(FIXTURES, 'gef', 'negative-penetration.gef'), 'utf8').replace('-0.005;', '-0.006;');
		await page.getByTestId('upload-input').setInputFiles({ name: 'PS-114-rev1.gef', mimeType: 'text/plain', buffer: Buffer.from(revised) });
		await page.getByTestId('upload-submit').click();
		const clash = page.getByTestId('clash-row');
		await clash.waitFor();
		expect(await clash.textContent()).toContain('the project: 40 readings from negative-penetration.gef');
		expect(await page.getByTestId('upload-submit').isDisabled()).toBe(true);
		expect(await page.getByTestId('upload-status').textContent()).toBe('Choose what happens to 1 taken name.');
		// Keep both under a name that is taken: refused, nothing written.
		await clash.getByTestId('clash-action').selectOption('rename');
		expect(await clash.getByTestId('clash-name').inputValue()).toBe('PS-114 (2)');
		await clash.getByTestId('clash-name').fill('CF-01');
		await page.getByTestId('upload-submit').click();
		await expect.poll(() => clash.textContent()).toContain('the new name CF-01 is taken too');
		expect(await rows().count()).toBe(4);
		// Replace: the readings change, the name and the row stay.
		await clash.getByTestId('clash-action').selectOption('replace');
		expect(await clash.textContent()).toContain("Replaces the readings of the project's PS-114");
		await page.getByTestId('upload-submit').click();
		await expect.poll(() => notice.textContent(), { timeout: 30_000 }).toContain('Replaced the readings of PS-114 (contacts kept).');
		expect(await rows().count()).toBe(4);
		await expect.poll(() => page.locator('[data-name="PS-114"]').textContent()).toContain('PS-114-rev1.gef');

		// The readings download: every reading of every sounding, derived properties with units in the header.
		const href = (await page.getByTestId('download-readings').getAttribute('href'))!;
		expect(href).toBe(`/api/v1/projects/${id}/soundings/readings.csv`);
		const csv = await (await page.request.get(href)).text();
		expect(csv.split('\r\n')[0]).toContain('depth (m),elevation (m),unit,qc (kPa),fs (kPa),u2 (kPa),qt (kPa)');
		expect(csv.trim().split('\r\n')).toHaveLength(1 + 3 * 300 + 40);
	});

	it('an analyst uploads the demo AGS4 file and opens the profiles of two selected soundings', async () => {
		const id = await newProject('E2E AGS');
		await openUpload(id);
		await page.getByTestId('upload-input').setInputFiles(join(DEMO_DIR, 'levee-cpt.ags'));
		await checkThenImport();
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

	it('in the demo project the profiles show the contacts, a click picks a new one and Undo puts the old one back', async () => {
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
		const dense = async () =>
			((await (await page.request.get(`/api/v1/projects/${demoId}/contacts`)).json()) as { contacts: { soundingId: string; unitId: string; topElevation: number }[] }).contacts.filter(
				(c) => c.soundingId === lv07.id
			);
		const status = (await page.getByTestId('pick-status').textContent())!;
		const picked = Number(/elevation (-?\d+\.\d\d)/.exec(status)![1]);
		expect((await dense()).some((c) => Math.abs(c.topElevation - picked) < 1e-9)).toBe(true);

		await page.getByTestId('pick-undo').click();
		await expect.poll(async () => (await page.getByTestId('pick-status').textContent())?.trim()).toMatch(/^Undone: the top of Dense sand at LV-07 is back at -?\d+\.\d\d m\.$/);
		expect((await dense()).some((c) => Math.abs(c.topElevation - picked) < 1e-9)).toBe(false);
		expect(await page.getByTestId('pick-undo').isDisabled()).toBe(true);
	});
});
