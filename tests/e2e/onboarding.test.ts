/**
 * End to end in headless Chromium against the built server: a project owner invites a colleague, the
 * invitation travels through the local SMTP outbox, and the colleague joins with exactly their role.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { DEMO, launchChromium, signInPage } from '../setup';

const baseUrl = inject('baseUrl');
let browser: Browser;

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => {
	await browser?.close();
});

function signIn(email: string, password: string): Promise<{ context: BrowserContext; page: Page }> {
	return signInPage(browser, baseUrl, { email, password });
}

/**
 * The first link in the newest outbox message whose subject contains `subject` (and sent `to`, when given),
 * read as the site admin; reloads the outbox until it arrives, as sign-in links are mailed after the response.
 */
async function linkFromOutbox(subject: string, pathPart: string, to?: string): Promise<string> {
	const { context, page } = await signIn(DEMO.admin.email, DEMO.admin.password);
	await page.goto('/admin/outbox');
	const item = page.getByTestId('outbox-list').getByRole('link', { name: subject }).filter(to ? { hasText: `to ${to}` } : {}).first();
	await expect
		.poll(async () => (await item.count()) > 0 || (await page.reload(), false), { timeout: 10_000 })
		.toBe(true);
	await item.click();
	await expect.poll(() => page.getByTestId('outbox-message').locator('h2').textContent()).toContain(subject);
	const href = await page.getByTestId('outbox-message').locator(`a[href*="${pathPart}"]`).first().getAttribute('href');
	await context.close();
	if (!href) throw new Error(`no ${pathPart} link in the "${subject}" message`);
	return href;
}

describe('invite a colleague (Chromium)', () => {
	it('owner creates a project and invites; the invitee joins from the e-mailed link with only their role', async () => {
		const owner = await signIn(DEMO.owner.email, DEMO.owner.password);
		const page = owner.page;

		await page.getByRole('link', { name: 'New project' }).click();
		await page.locator('input[name="name"]').fill('Harbour embankment');
		await page.locator('textarea[name="description"]').fill('Reclaimed fill over soft estuarine clay.');
		await page.getByLabel('feet (ft)').check();
		await page.getByRole('button', { name: 'Create project' }).click();
		await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
		const projectUrl = new URL(page.url()).pathname;
		await expect.poll(() => page.locator('h1').textContent()).toBe('Harbour embankment');
		expect(await page.getByText('Lengths in feet').count()).toBe(1);
		expect(await page.getByRole('note').textContent()).toContain('licensed engineer');

		await page.getByRole('navigation', { name: 'Project sections' }).getByRole('link', { name: 'Team' }).click();
		await page.waitForURL(`**${projectUrl}/team`);
		await page.locator('form[action="?/invite"] input[name="email"]').fill('Newcomer@Example.test');
		await page.locator('form[action="?/invite"] select[name="role"]').selectOption('reviewer');
		await page.getByRole('button', { name: 'Send invitation' }).click();
		await expect.poll(() => page.getByRole('status').textContent()).toContain('Invitation sent to newcomer@example.test');
		await owner.context.close();

		const link = await linkFromOutbox('Harbour embankment', '/invitations/');
		expect(link.startsWith(`${baseUrl}/invitations/`)).toBe(true);

		const context = await browser.newContext({ baseURL: baseUrl });
		const newcomer = await context.newPage();
		await newcomer.goto(link);
		expect(await newcomer.locator('main').textContent()).toContain('Harbour embankment');
		await newcomer.locator('input[name="name"]').fill('Nia Newcomer');
		await newcomer.locator('input[name="password"]').fill('a-long-new-password');
		await newcomer.locator('input[name="confirm"]').fill('a-long-new-password');
		await newcomer.getByRole('button', { name: 'Create account and join' }).click();
		await newcomer.waitForURL(`**${projectUrl}`);
		await expect.poll(() => newcomer.locator('h1').textContent()).toBe('Harbour embankment');
		expect(await newcomer.getByText('You are reviewer').count()).toBe(1);

		// The member list shows both; there are no controls to manage it.
		await newcomer.goto(`${projectUrl}/team`);
		expect(await newcomer.getByTestId('members').textContent()).toContain('newcomer@example.test');
		expect(await newcomer.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
		expect(await newcomer.getByRole('button', { name: 'Remove' }).count()).toBe(0);
		expect(await newcomer.getByText('Only project owners can invite').count()).toBe(1);

		// And the server refuses it too, with the same session.
		const projectId = projectUrl.split('/').pop();
		const refused = await context.request.post(`/api/v1/projects/${projectId}/members`, {
			data: { email: 'someone@example.test', role: 'viewer' }
		});
		expect(refused.status()).toBe(403);

		// Only the project they were invited to is listed.
		await newcomer.goto('/projects');
		expect(await newcomer.getByTestId('project-list').locator('li').count()).toBe(1);

		// The link worked once.
		await newcomer.goto(link);
		expect(await newcomer.locator('main').textContent()).toContain('expired or was already used');
		await context.close();
	});

	it('a demo user signs in with an e-mail link that arrives in the outbox', async () => {
		const context = await browser.newContext({ baseURL: baseUrl });
		const page = await context.newPage();
		await page.goto('/signin');
		await page.locator('form[action="?/link"] input[name="email"]').fill(DEMO.viewer.email);
		await page.getByRole('button', { name: 'Send me a link' }).click();
		await page.waitForURL('**/signin/check-email**');

		const link = await linkFromOutbox('Your Conefield sign-in link', '/auth/callback/nodemailer', DEMO.viewer.email);
		await page.goto(link);
		await page.waitForURL('**/projects');
		expect(await page.getByTestId('account-menu').textContent()).toContain('Vera Viewer');
		await context.close();
	});
});
