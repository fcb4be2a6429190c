/**
 * On a slow connection people type into a server-rendered form before the page's script has arrived. When the
 * script then hydrates the page, what they typed must still be there, and the form must submit it: here the page's
 * scripts are held back while the fields are filled, then let through. (A field rendered with `value` lost its text
 * at hydration, and a required e-mail left empty blocked the sign-in without a word.) Each submission is checked to
 * go through the hydrated form (SvelteKit's `x-sveltekit-action` request), so the test cannot pass on a page that
 * was never hydrated.
 */
import type { Browser, Page, Request } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, launchChromium } from '../setup';

const baseUrl = inject('baseUrl');
let browser: Browser;

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => {
	await browser?.close();
});

/**
 * Opens `path` with the app's scripts held back, lets `type` fill the server-rendered page, then lets the scripts
 * through and waits until the network is quiet (the page hydrated). Returns the form actions posted from then on.
 */
async function typeBeforeScripts(page: Page, path: string, type: () => Promise<void>): Promise<Request[]> {
	let release!: () => void;
	const held = new Promise<void>((resolve) => (release = resolve));
	const scripts = /\/_app\/immutable\/.*\.js$/;
	await page.route(scripts, async (route) => {
		await held;
		await route.continue();
	});
	await page.goto(path, { waitUntil: 'commit' });
	await page.locator('main form').first().waitFor({ state: 'attached' });
	await type();
	release();
	await page.waitForLoadState('networkidle');
	await page.unroute(scripts);
	const posts: Request[] = [];
	page.on('request', (r) => {
		if (r.method() === 'POST') posts.push(r);
	});
	return posts;
}

/** Whether the hydrated form sent this request (use:enhance posts with x-sveltekit-action). */
async function enhanced(r: Request): Promise<boolean> {
	return (await r.allHeaders())['x-sveltekit-action'] === 'true';
}

describe('typed before the page script runs', () => {
	it('sign-in keeps the e-mail and signs in; a new project keeps its name, description and unit; an invitation its address and role', async () => {
		const context = await browser.newContext({ baseURL: baseUrl });
		const page = await context.newPage();

		const email = page.locator('form[action="?/password"] input[name="email"]');
		const signInPosts = await typeBeforeScripts(page, '/signin', async () => {
			await email.fill(DEMO.owner.email);
			await page.locator('input[name="password"]').fill(DEMO.owner.password);
		});
		expect(await email.inputValue()).toBe(DEMO.owner.email);
		await page.getByRole('button', { name: 'Sign in', exact: true }).click();
		await page.waitForURL('**/projects');
		expect(signInPosts).toHaveLength(1);
		expect(await enhanced(signInPosts[0])).toBe(true);

		const name = page.locator('input[name="name"]');
		const description = page.locator('textarea[name="description"]');
		const feet = page.getByLabel('feet (ft)');
		const createPosts = await typeBeforeScripts(page, '/projects/new', async () => {
			await name.fill('Typed-early embankment');
			await description.fill('Filled in before the script arrived.');
			await feet.check();
		});
		expect(await name.inputValue()).toBe('Typed-early embankment');
		expect(await description.inputValue()).toBe('Filled in before the script arrived.');
		expect(await feet.isChecked()).toBe(true);
		await page.getByRole('button', { name: 'Create project' }).click();
		await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
		expect(await enhanced(createPosts[0])).toBe(true);
		await expect.poll(() => page.locator('h1').textContent()).toBe('Typed-early embankment');
		expect(await page.getByText('Filled in before the script arrived.').count()).toBe(1);
		expect(await page.getByText('Lengths in feet').count()).toBe(1);

		const projectUrl = new URL(page.url()).pathname;
		const invitee = page.locator('form[action="?/invite"] input[name="email"]');
		const role = page.locator('form[action="?/invite"] select[name="role"]');
		const invitePosts = await typeBeforeScripts(page, `${projectUrl}/team`, async () => {
			await invitee.fill('early-typist@example.test');
			await role.selectOption('reviewer');
		});
		expect(await invitee.inputValue()).toBe('early-typist@example.test');
		expect(await role.inputValue()).toBe('reviewer');
		await page.getByRole('button', { name: 'Send invitation' }).click();
		await expect.poll(() => page.getByRole('status').textContent()).toContain('Invitation sent to early-typist@example.test');
		expect(await enhanced(invitePosts[0])).toBe(true);
		// After a successful invitation the field is empty again, ready for the next colleague.
		await expect.poll(() => invitee.inputValue()).toBe('');
		const pending = page.locator('section', { has: page.getByRole('heading', { name: 'Pending invitations' }) }).locator('tbody tr');
		await expect.poll(() => pending.count()).toBe(1);
		expect(await pending.locator('td').first().textContent()).toBe('early-typist@example.test');
		expect(await pending.locator('td').nth(1).textContent()).toContain('reviewer');
		await context.close();
	});
});
