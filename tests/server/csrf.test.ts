import { describe, expect, it } from 'vitest';
import { crossSiteRefusal, refuseUnread } from '$lib/server/csrf';

const ORIGIN = 'http://conefield.test';
function request(path: string, { method = 'POST', type = 'multipart/form-data; boundary=x', origin, authorization, accept }: { method?: string; type?: string | null; origin?: string; authorization?: string; accept?: string } = {}) {
	const headers = new Headers();
	if (type) headers.set('content-type', type);
	if (origin) headers.set('origin', origin);
	if (authorization) headers.set('authorization', authorization);
	if (accept) headers.set('accept', accept);
	return [new Request(ORIGIN + path, { method, headers, body: method === 'GET' ? undefined : 'x' }), new URL(ORIGIN + path)] as const;
}

describe('crossSiteRefusal(request, url)', () => {
	it('lets same-origin form posts, safe methods and JSON bodies through', () => {
		expect(crossSiteRefusal(...request('/projects/new', { origin: ORIGIN }))).toBeNull();
		expect(crossSiteRefusal(...request('/api/v1/projects', { method: 'GET', type: null }))).toBeNull();
		expect(crossSiteRefusal(...request('/api/v1/projects', { type: 'application/json' }))).toBeNull();
	});

	it('lets an /api request with an Authorization header through with no or any Origin', () => {
		expect(crossSiteRefusal(...request('/api/v1/projects/p/soundings', { authorization: 'Bearer cf_x' }))).toBeNull();
		expect(crossSiteRefusal(...request('/api/v1/projects/p/soundings', { authorization: 'Bearer cf_x', origin: 'https://evil.example' }))).toBeNull();
	});

	it('refuses a form post without a matching Origin: in the API’s shape under /api, as text elsewhere', async () => {
		for (const type of ['multipart/form-data; boundary=x', 'application/x-www-form-urlencoded', 'text/plain;charset=UTF-8']) {
			for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
				const api = crossSiteRefusal(...request('/api/v1/projects', { type, method, origin: 'https://evil.example' }));
				expect(api?.status).toBe(403);
				expect(((await api!.json()) as { error: { code: string } }).error.code).toBe('forbidden');
			}
		}
		const page = crossSiteRefusal(...request('/projects/new'));
		expect(page?.status).toBe(403);
		expect(await page!.text()).toContain('Cross-site POST form submissions are forbidden');
	});

	it('an Authorization header does not excuse a page form post (pages use the cookie)', () => {
		expect(crossSiteRefusal(...request('/account', { authorization: 'Bearer cf_x' }))?.status).toBe(403);
	});
});

describe('refuseUnread(request, response)', () => {
	it('reads a small declared body, and closes the connection instead for a large or undeclared one', async () => {
		const small = new Request(`${ORIGIN}/api/v1/x`, { method: 'POST', headers: { 'content-length': '5' }, body: 'hello' });
		const kept = await refuseUnread(small, new Response(null, { status: 403 }));
		expect(small.bodyUsed).toBe(true);
		expect(kept.headers.get('connection')).toBeNull();
		const large = new Request(`${ORIGIN}/api/v1/x`, { method: 'POST', headers: { 'content-length': String(2 ** 21) }, body: 'x' });
		const closed = await refuseUnread(large, new Response(null, { status: 403 }));
		expect(large.bodyUsed).toBe(false);
		expect(closed.headers.get('connection')).toBe('close');
	});
});
