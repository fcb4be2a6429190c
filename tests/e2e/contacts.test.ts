/**
 * End to end in headless Chromium, in a project of the analyst's own (the demo stays untouched): the contacts
 * table shows the top unit's ground default and a sounding's interpolated contacts, reads a block pasted from
 * a spreadsheet and says what it read before saving it, a contact picked on a profile is undone, a new unit
 * asks for its property, and zone names saved before a boundary stay in sight.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, launchChromium, signInPage } from '../setup';

const baseUrl = inject('baseUrl');
const GEF_DIR = join(import.meta.dirname, '..', '..', 'static', 'demo', 'gef');
let browser: Browser;
let context: BrowserContext;
let page: Page;
let projectId: string;
let ids: Record<string, string>;
let sand: string;

interface ContactJson {
	soundingName: string;
	unitId: string;
	topElevation: number;
	interpolated: boolean;
}

const api = (path: string) => `/api/v1/projects/${projectId}${path}`;
async function contacts(): Promise<ContactJson[]> {
	return ((await (await page.request.get(api('/contacts'))).json()) as { contacts: ContactJson[] }).contacts;
}
async function send(method: 'POST' | 'PATCH', path: string, data: unknown): Promise<unknown> {
	const res = await page.request.fetch(api(path), { method, data });
	expect(res.ok(), `${method} ${path}: ${await res.text()}`).toBe(true);
	return res.json();
}

/** Pastes `text` into a cell as a spreadsheet's copy does (a paste event carrying text/plain). */
async function paste(cell: string, text: string) {
	await page.getByLabel(cell, { exact: true }).evaluate((el, t) => {
		(el as HTMLInputElement).focus();
		const data = new DataTransfer();
		data.setData('text/plain', t);
		el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
	}, text);
}

beforeAll(async () => {
	browser = await launchChromium();
	({ context, page } = await signInPage(browser, baseUrl, DEMO.analyst, { width: 1280, height: 800 }));
	const projects = ((await (await page.request.get('/api/v1/projects')).json()) as { projects: { id: string; name: string }[] }).projects;
	const demoId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	const demoSite = ((await (await page.request.get(`/api/v1/projects/${demoId}/site`)).json()) as { site: { sectionLine: [number, number][] } }).site;
	const created = await page.request.post('/api/v1/projects', { data: { name: 'Contacts in Chromium', description: '', lengthUnit: 'm' } });
	projectId = ((await created.json()) as { project: { id: string } }).project.id;
	await send('PATCH', '/site', { sectionLine: demoSite.sectionLine, groundwaterElevation: 2.5 });
	for (const name of ['LV-01.gef', 'LV-05.gef', 'LV-09.gef']) {
		// A multipart body is a form post: SvelteKit wants to see the page's own origin.
		const res = await page.request.post(api('/soundings'), {
			headers: { origin: baseUrl },
			multipart: { files: { name, mimeType: 'text/plain', buffer: readFileSync(join(GEF_DIR, name)) } }
		});
		expect(res.status()).toBe(201);
	}
	await send('POST', '/units', { name: 'Clay', property: 'suRatio' });
	sand = ((await send('POST', '/units', { name: 'Sand', property: 'qc1Ncs' })) as { unit: { id: string } }).unit.id;
	const list = ((await (await page.request.get(api('/soundings'))).json()) as { soundings: { id: string; name: string }[] }).soundings;
	ids = Object.fromEntries(list.map((s) => [s.name, s.id]));
	await send('PATCH', '/contacts', {
		set: [
			{ soundingId: ids['LV-01'], unitId: sand, topElevation: 2.3 },
			{ soundingId: ids['LV-09'], unitId: sand, topElevation: 1.3 }
		]
	});
});
afterAll(async () => {
	await context?.close();
	await browser?.close();
});

describe('contacts (Chromium)', () => {
	it('the table shows the top unit at the ground surface and LV-05 taking its contacts from its neighbours', async () => {
		await page.goto(`/projects/${projectId}/stratigraphy`);
		const lv05 = page.locator('[data-testid="contact-row"][data-sounding="LV-05"]');
		await lv05.waitFor();
		expect(await lv05.textContent()).toContain('from neighbours');
		const clay = page.getByLabel('Top of Clay at LV-05', { exact: true });
		expect(await clay.getAttribute('data-source')).toBe('ground');
		expect(await clay.inputValue()).toBe('');
		expect(Number(await clay.getAttribute('placeholder'))).toBeGreaterThan(3); // the ground elevation, about 4 m
		const sandCell = page.getByLabel('Top of Sand at LV-05', { exact: true });
		expect(await sandCell.getAttribute('data-source')).toBe('interpolated');
		expect(await sandCell.evaluate((el) => getComputedStyle(el).fontStyle)).toBe('italic');
		// Between 2.3 (LV-01) and 1.3 (LV-09).
		const v = Number(await sandCell.inputValue());
		expect(v).toBeGreaterThan(1.3);
		expect(v).toBeLessThan(2.3);
	});

	it('a block pasted from a spreadsheet is read, described and saved only when confirmed', async () => {
		await paste('Top of Clay at LV-01', 'Sounding\tSand top (m)\nLV-01\t2.1\nLV-05\t1,9\nLV-09\t\n');
		const preview = page.getByTestId('paste-preview');
		await preview.waitFor();
		expect(await page.getByTestId('paste-summary').textContent()).toBe(
			'Read 3 soundings × 1 unit (rows by sounding name, columns by unit name). 2 tops to set, 1 contact to remove (empty cells: the unit is absent there).'
		);
		// Nothing is written yet.
		expect((await contacts()).find((c) => c.soundingName === 'LV-05')!.interpolated).toBe(true);
		await page.getByTestId('paste-save').click();
		await preview.waitFor({ state: 'detached' });
		const after = (await contacts()).filter((c) => c.unitId === sand);
		expect(after.map((c) => [c.soundingName, c.topElevation, c.interpolated])).toEqual([
			['LV-01', 2.1, false],
			['LV-05', 1.9, false]
		]);
		await expect.poll(() => page.getByLabel('Top of Sand at LV-05', { exact: true }).getAttribute('data-source')).toBe('measured');
	});

	it('a pasted cell that is not a number is named and nothing can be saved; depths are read as depths when asked', async () => {
		await paste('Top of Sand at LV-01', '2.0\nabc\n');
		expect(await page.getByTestId('paste-preview').textContent()).toContain('LV-05, Sand: “abc” is not a number.');
		expect(await page.getByTestId('paste-save').isDisabled()).toBe(true);
		await page.getByRole('button', { name: 'Cancel' }).click();
		await paste('Top of Sand at LV-01', '1.5\n1.0\n');
		await page.getByTestId('paste-depths').check();
		const ground = Number(await page.getByLabel('Top of Clay at LV-01', { exact: true }).getAttribute('placeholder'));
		const row = page.getByTestId('paste-preview').locator('tbody tr').first();
		expect(await row.textContent()).toContain((ground - 1.5).toFixed(2));
		await page.getByRole('button', { name: 'Cancel' }).click();
	});

	it('a contact picked on a profile is undone, and the sounding takes its neighbours’ contacts again', async () => {
		// LV-09's sand was removed by the paste above: put it back, and let LV-05 follow its neighbours again.
		await send('PATCH', '/contacts', { set: [{ soundingId: ids['LV-09'], unitId: sand, topElevation: 1.3 }], interpolate: [ids['LV-05']] });
		const before = (await contacts()).find((c) => c.soundingName === 'LV-05' && c.unitId === sand)!;
		expect(before.interpolated).toBe(true);
		await page.goto(`/projects/${projectId}/soundings/profiles?s=${ids['LV-05']}`);
		const plot = page.getByTestId('profile-LV-05');
		await plot.waitFor();
		expect(await plot.locator('[data-testid="contact-line"][data-interpolated="true"]').count()).toBe(1);
		await page.getByTestId('pick-unit').selectOption({ label: 'Sand' });
		await page.getByTestId('pick-toggle').click();
		const box = (await plot.locator('svg').boundingBox())!;
		await page.mouse.click(box.x + box.width / 2, box.y + box.height * 0.5);
		await expect.poll(() => page.getByTestId('pick-status').textContent()).toMatch(/^Top of Sand at LV-05/);
		expect((await contacts()).find((c) => c.soundingName === 'LV-05' && c.unitId === sand)!.interpolated).toBe(false);
		await page.getByTestId('pick-status').getByRole('button', { name: 'Undo' }).click();
		await expect.poll(async () => (await page.getByTestId('pick-status').textContent())?.trim()).toBe('Undone: the top of Sand at LV-05 is interpolated from its neighbours again.');
		expect((await contacts()).find((c) => c.soundingName === 'LV-05' && c.unitId === sand)).toEqual(before);
	});

	it('a new unit asks for its property, and zone names saved before a boundary stay in sight', async () => {
		await page.goto(`/projects/${projectId}/stratigraphy`);
		await page.locator('input[name="new-unit"]').fill('Soft clay');
		await page.getByRole('button', { name: 'Add unit at the bottom' }).click();
		await expect.poll(() => page.getByTestId('units-editor').getByRole('alert').textContent()).toMatch(/Choose the property to simulate Soft clay in/);
		await page.locator('select[name="new-unit-property"]').selectOption('suRatio');
		await page.getByRole('button', { name: 'Add unit at the bottom' }).click();
		await page.locator('[data-testid="unit-row"][data-unit="Soft clay"]').waitFor();
		const units = ((await (await page.request.get(api('/units'))).json()) as { units: { name: string; property: string }[] }).units;
		expect(units.find((u) => u.name === 'Soft clay')!.property).toBe('suRatio');

		await page.getByLabel('Zone names of Sand').fill('West, East');
		await page.getByRole('button', { name: 'Save Sand' }).click();
		const state = page.locator('[data-testid="unit-row"][data-unit="Sand"] [data-testid="zone-state"]');
		await expect.poll(() => state.textContent()).toMatch(/kept for its zone boundaries/);
		await page.reload();
		await expect.poll(() => page.getByLabel('Zone names of Sand').inputValue()).toBe('West, East');
	});
});
