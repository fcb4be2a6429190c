/**
 * End to end in headless Chromium against the built server: the demo analyst opens the variography of a
 * demo domain, waits for both experimental variograms (computed in the page's Web Worker), runs the
 * automatic fit, saves it, reloads and finds the saved model. The figures the page shows (each bin's h,
 * gamma and pairs, the fitted parameters, the misfit) are checked against the same computations run here in
 * Node on the same samples fetched from the API: bit for bit, since the engine's arithmetic is +, −, ×, ÷,
 * sqrt and @stdlib functions, identical in both (DESIGN.md); and against one direct experimentalVariogram
 * call per direction within 1e-12 relative (the chunked sums differ only in summation order).
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, DEMO_PROJECT_NAME, HttpSession, launchChromium, signInPage, signedInSession } from '../setup';
import { experimentalVariogram, type LagBin } from '../../src/lib/geostat/index';
import {
	autoFit,
	computeVariograms,
	modelMisfit,
	prepareSamples,
	type DomainSamplesData,
	type VariogramSettings
} from '../../src/lib/variography/index';

const baseUrl = inject('baseUrl');
let browser: Browser;
let api: HttpSession;
let projectId: string;
let zonations: { id: string; name: string; domains: { id: string; name: string }[] }[];

beforeAll(async () => {
	browser = await launchChromium();
	api = await signedInSession(baseUrl, DEMO.analyst.email, DEMO.analyst.password);
	const { projects } = (await (await api.json('GET', '/api/v1/projects')).json()) as { projects: { id: string; name: string }[] };
	projectId = projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
	zonations = (await (await api.json('GET', `/api/v1/projects/${projectId}/zonations`)).json()).zonations;
});
afterAll(async () => {
	await browser?.close();
});

function signIn(): Promise<{ context: BrowserContext; page: Page }> {
	return signInPage(browser, baseUrl, DEMO.analyst, { width: 1600, height: 1100 });
}

/** Waits until the page shows both variograms of `domainId`. */
async function waitForVariograms(page: Page, domainId: string) {
	await page.locator(`[data-testid=plots][data-domain="${domainId}"]`).waitFor({ timeout: 60_000 });
	await page.locator('[data-testid=plot-vertical] [data-bin]').first().waitFor();
	await page.locator('[data-testid=plot-horizontal] [data-bin]').first().waitFor();
}

/** The lag table of a direction as the page holds it (attributes carry the full numbers). */
async function lagTable(page: Page, dir: 'vertical' | 'horizontal'): Promise<LagBin[]> {
	return page.locator(`[data-testid=lags-${dir}] tbody tr`).evaluateAll((rows) =>
		rows.map((r) => {
			const d = (r as HTMLElement).dataset;
			return { h: Number(d.h), gamma: Number(d.gamma), pairs: Number(d.pairs) };
		})
	);
}

function expectSameBits(actual: LagBin[], expected: LagBin[]) {
	expect(actual.length).toBe(expected.length);
	actual.forEach((b, k) => {
		expect(b.pairs, `bin ${k} pairs`).toBe(expected[k].pairs);
		expect(Object.is(b.h, expected[k].h), `bin ${k} h ${b.h} vs ${expected[k].h}`).toBe(true);
		expect(Object.is(b.gamma, expected[k].gamma), `bin ${k} gamma ${b.gamma} vs ${expected[k].gamma}`).toBe(true);
	});
}

describe('variography (Chromium)', () => {
	it('the analyst fits and saves a domain; the page\'s bins, fit and misfit equal the engine\'s in Node', async () => {
		const domain = zonations.flatMap((z) => z.domains).find((d) => /sand/i.test(d.name)) ?? zonations[0].domains[0];
		const { context, page } = await signIn();
		const errors: string[] = [];
		page.on('pageerror', (e) => errors.push(String(e)));
		page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
		await page.goto(`/projects/${projectId}/variography?domain=${domain.id}`);
		await waitForVariograms(page, domain.id);

		const settings = JSON.parse((await page.getByTestId('plots').getAttribute('data-settings'))!) as VariogramSettings;
		const data = (await (await api.json('GET', `/api/v1/projects/${projectId}/domains/${domain.id}/samples`)).json()) as DomainSamplesData;
		const prepared = prepareSamples(data, settings);
		const node = await computeVariograms(prepared, settings);
		const shown = { vertical: await lagTable(page, 'vertical'), horizontal: await lagTable(page, 'horizontal') };
		expectSameBits(shown.vertical, node.vertical);
		expectSameBits(shown.horizontal, node.horizontal);
		// The plot points carry the same numbers as the table (non-empty bins only).
		const points = await page.locator('[data-testid=plot-vertical] [data-bin]').evaluateAll((g) => g.map((e) => Number((e as HTMLElement).dataset.gamma)));
		expect(points).toEqual(node.vertical.filter((b) => b.pairs > 0).map((b) => b.gamma));
		// One direct engine call per direction: same pairs, gamma within 1e-12 relative.
		const direct = experimentalVariogram(prepared.samples, { direction: 'vertical', ...settings.vertical });
		direct.forEach((b, k) => {
			expect(shown.vertical[k].pairs).toBe(b.pairs);
			if (b.pairs > 0) expect(Math.abs(shown.vertical[k].gamma - b.gamma)).toBeLessThanOrEqual(1e-12 * b.gamma);
		});
		expect(shown.horizontal.some((b) => b.pairs >= settings.minPairs)).toBe(true);

		await page.getByTestId('auto-fit').click();
		const summary = page.getByTestId('model-summary');
		await summary.waitFor();
		const fit = autoFit(node, { type: 'exponential', nugget: 'fit', minPairs: settings.minPairs, azimuth: 0, variance: node.variance });
		expect(Number(await summary.getAttribute('data-range-vertical'))).toBe(fit.parameters.rangeVertical);
		expect(Number(await summary.getAttribute('data-range-horizontal'))).toBe(fit.parameters.rangeMajor);
		expect(Number(await summary.getAttribute('data-sill'))).toBe(fit.parameters.sill);
		expect(Number(await summary.getAttribute('data-nugget'))).toBe(fit.parameters.nugget);
		const misfit = modelMisfit(fit.model, node, settings.minPairs).total!.perBin;
		await expect.poll(async () => Number(await page.getByTestId('misfit').getAttribute('data-misfit'))).toBe(misfit);
		await page.getByTestId('sensitivity').waitFor();
		await page.screenshot({ path: '/work/notes/variography-e2e-fit.png', fullPage: true });

		const name = `E2E ${domain.name} ${Date.now()}`;
		await page.getByTestId('save-name').fill(name);
		await page.getByTestId('save').click();
		await expect.poll(() => page.getByTestId('status').textContent()).toContain(`Saved as ${name} v1`);

		await page.reload();
		await waitForVariograms(page, domain.id);
		const row = page.locator(`[data-testid=saved-variogram][data-name="${name}"]`);
		await row.waitFor();
		expect(await row.getAttribute('data-version')).toBe('1');
		// The newest saved model is loaded into the workspace on reload.
		expect(Number(await page.getByTestId('model-summary').getAttribute('data-range-horizontal'))).toBe(fit.parameters.rangeMajor);
		const saved = (await (await api.json('GET', `/api/v1/projects/${projectId}/domains/${domain.id}/variograms`)).json()).variograms.find(
			(v: { name: string }) => v.name === name
		);
		expect(saved.model).toEqual(fit.model);
		expect(saved.misfit).toBe(misfit);
		expect(saved.settings).toMatchObject(settings);
		expect(errors).toEqual([]);
		await context.close();
	});

	it('every domain of both zonations gets vertical and horizontal variograms, an automatic fit and a saved model', async () => {
		expect(zonations.length).toBeGreaterThanOrEqual(2);
		const { context, page } = await signIn();
		await page.goto(`/projects/${projectId}/variography`);
		for (const z of zonations) {
			await page.getByTestId('zonation-select').selectOption(z.id);
			for (const d of z.domains) {
				await page.getByTestId('domain-select').selectOption(d.id);
				await waitForVariograms(page, d.id);
				await page.getByTestId('auto-fit').click();
				await expect.poll(async () => Number(await page.getByTestId('model-summary').getAttribute('data-range-horizontal'))).toBeGreaterThan(0);
				const vr = Number(await page.getByTestId('model-summary').getAttribute('data-range-vertical'));
				expect(Number.isFinite(vr) && vr > 0, `${z.name} / ${d.name} vertical range`).toBe(true);
				await page.getByTestId('save-name').fill(`${d.name} (all-domains check)`);
				await page.getByTestId('save').click();
				// This domain's own save: the status of the previous one must not pass for it.
				await expect.poll(() => page.getByTestId('status').textContent()).toContain(`Saved as ${d.name} (all-domains check)`);
				expect(await page.getByTestId('problem').count(), `${z.name} / ${d.name}`).toBe(0);
			}
		}
		for (const d of zonations.flatMap((z) => z.domains)) {
			const { variograms } = await (await api.json('GET', `/api/v1/projects/${projectId}/domains/${d.id}/variograms`)).json();
			expect(variograms.some((v: { name: string }) => v.name === `${d.name} (all-domains check)`), d.name).toBe(true);
		}
		await context.close();
	});

	it('stale state: changing the property from normal scores to raw values and computing drops the old model; the new one is of the raw values', async () => {
		const domain = zonations[0].domains.find((d) => /west/i.test(d.name))!;
		const { context, page } = await signIn();
		const errors: string[] = [];
		page.on('pageerror', (e) => errors.push(String(e)));
		await page.goto(`/projects/${projectId}/variography?domain=${domain.id}`);
		await waitForVariograms(page, domain.id);
		// The seeded version is of the normal scores: its sill is their variance, about 1.
		const summary = page.getByTestId('model-summary');
		await summary.waitFor();
		const normalSill = Number(await summary.getAttribute('data-sill'));
		expect(Math.abs(normalSill - 1)).toBeLessThan(0.02);

		await page.getByTestId('transform').selectOption('none');
		await page.getByRole('button', { name: 'Compute', exact: true }).click();
		await page.locator('[data-testid=plots][data-settings*=\'"transform":"none"\']').waitFor({ timeout: 60_000 });
		await expect.poll(() => page.getByTestId('status').textContent(), { timeout: 30_000 }).toContain('the old model was dropped');
		const settings = JSON.parse((await page.getByTestId('plots').getAttribute('data-settings'))!) as VariogramSettings;
		const data = (await (await api.json('GET', `/api/v1/projects/${projectId}/domains/${domain.id}/samples`)).json()) as DomainSamplesData;
		const node = await computeVariograms(prepareSamples(data, settings), settings);
		// The model now drawn is the automatic fit of the raw values: its sill is their declustered variance (qc1Ncs², hundreds).
		await expect.poll(async () => Number(await page.getByTestId('model-summary').getAttribute('data-sill'))).toBe(node.variance);
		expect(node.variance).toBeGreaterThan(50);
		const fit = autoFit(node, { type: 'exponential', nugget: 'fit', minPairs: settings.minPairs, azimuth: 0, variance: node.variance });
		expect(Number(await page.getByTestId('model-summary').getAttribute('data-range-vertical'))).toBe(fit.parameters.rangeVertical);
		// The plot's curve is the new model's: its right end sits near the raw variance, not near 1.
		expect(await page.locator('[data-testid=plot-vertical] [data-bin]').count()).toBeGreaterThan(0);
		expect(errors).toEqual([]);
		await context.close();
	});
});