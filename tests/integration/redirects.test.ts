/**
 * Open redirects (issue 11, Medium 3): `redirectTo` may only name a path on this site. Browsers read `/\host`
 * and `/<tab>/host` as `//host`, so those must go to the projects page like any other foreign target.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO, HttpSession, signedInSession } from '../setup';

const baseUrl = inject('baseUrl');
let viewer: HttpSession;

const FOREIGN = [
	'/%5Cevil.example',
	'/%09/evil.example',
	'/%0A/evil.example',
	'/%5C%5Cevil.example',
	'//evil.example',
	'///evil.example',
	'https://evil.example/',
	'http:evil.example',
	'javascript:alert(1)',
	'%2F%2Fevil.example'
];

beforeAll(async () => {
	viewer = await signedInSession(baseUrl, DEMO.viewer.email, DEMO.viewer.password);
});

describe('GET /signin?redirectTo=… when signed in', () => {
	it.each(FOREIGN)('%s goes to /projects', async (target) => {
		const res = await viewer.fetch(`/signin?redirectTo=${target}`, { headers: { accept: 'text/html' } });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/projects');
	});

	it('a path on this site is kept, with its query', async () => {
		const res = await viewer.fetch(`/signin?redirectTo=${encodeURIComponent('/projects?tab=all')}`, { headers: { accept: 'text/html' } });
		expect(res.headers.get('location')).toBe('/projects?tab=all');
	});
});

describe('signing in with a foreign redirectTo', () => {
	it.each(FOREIGN.map(decodeURIComponent))('%j lands on this site’s projects page', async (target) => {
		const s = new HttpSession(baseUrl);
		const res = await s.form('/signin?/password', { email: DEMO.viewer.email, password: DEMO.viewer.password, redirectTo: target }, 'text/html');
		expect(s.signedIn).toBe(true);
		const location = new URL(res.headers.get('location')!, baseUrl);
		expect(location.origin).toBe(baseUrl);
		expect(location.pathname).toBe('/projects');
	});

	it('the sign-in page does not echo a foreign target into its forms', async () => {
		const html = await (await new HttpSession(baseUrl).fetch('/signin?redirectTo=/%5Cevil.example', { headers: { accept: 'text/html' } })).text();
		expect(html).not.toContain('evil.example');
		expect(html).toContain('name="redirectTo" value="/projects"');
	});
});
