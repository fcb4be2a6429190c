import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** The flags this machine's headless Chromium needs (no sandbox, GPU, QUIC or background traffic). */
export const CHROMIUM_ARGS = [
	'--headless',
	'--no-sandbox',
	'--disable-gpu',
	'--disable-quic',
	'--no-first-run',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync'
];

export function launchChromium(): Promise<Browser> {
	return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
}

/**
 * A new browser context on the test server, signed in through the real sign-in form as the given account;
 * resolves once the projects page shows.
 */
export async function signInPage(
	browser: Browser,
	baseUrl: string,
	account: { email: string; password: string },
	viewport?: { width: number; height: number }
): Promise<{ context: BrowserContext; page: Page }> {
	const context = await browser.newContext({ baseURL: baseUrl, ...(viewport ? { viewport } : {}) });
	const page = await context.newPage();
	await page.goto('/signin');
	await page.locator('form[action="?/password"] input[name="email"]').fill(account.email);
	await page.locator('input[name="password"]').fill(account.password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await page.waitForURL('**/projects');
	return { context, page };
}
