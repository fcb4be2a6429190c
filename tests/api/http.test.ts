import { afterEach, describe, expect, it, vi } from 'vitest';
import { RequestFailed, getJson, send, sendForm } from '../../src/lib/api/index';

/** Replaces fetch with one that records its calls and answers `respond()`. */
function answer(respond: () => Response | Promise<Response>) {
	const calls: { url: string; init: RequestInit }[] = [];
	vi.stubGlobal('fetch', async (url: string, init: RequestInit) => {
		calls.push({ url, init });
		return respond();
	});
	return calls;
}
const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

afterEach(() => {
	vi.unstubAllGlobals();
});

describe('getJson, send and sendForm', () => {
	it('getJson(url) asks for JSON and returns the parsed body', async () => {
		const calls = answer(() => json({ units: [1, 2] }));
		expect(await getJson('/api/v1/x')).toEqual({ units: [1, 2] });
		expect(calls[0].init.method).toBe('GET');
		expect((calls[0].init.headers as Record<string, string>).accept).toBe('application/json');
	});

	it('send(method, url, body) sends JSON with its content type; without a body, none', async () => {
		const calls = answer(() => json({ ok: true }, 201));
		await send('PATCH', '/a', { name: 'Sand' });
		await send('POST', '/b');
		expect(calls[0].init).toMatchObject({ method: 'PATCH', body: '{"name":"Sand"}' });
		expect((calls[0].init.headers as Record<string, string>)['content-type']).toBe('application/json');
		expect(calls[1].init.body).toBeUndefined();
		expect((calls[1].init.headers as Record<string, string>)['content-type']).toBeUndefined();
	});

	it('send(...) resolves undefined on 204 No Content', async () => {
		answer(() => new Response(null, { status: 204 }));
		expect(await send('DELETE', '/a')).toBeUndefined();
	});

	it('a refusal rejects with RequestFailed: status, code, the message followed by each issue, and the error object', async () => {
		answer(() =>
			json({ error: { code: 'invalid', message: 'The request body is not valid.', issues: [{ path: ['name'], message: 'Enter a unit name.' }] } }, 422)
		);
		const err = (await send('POST', '/a', {}).catch((e: unknown) => e)) as RequestFailed;
		expect(err).toBeInstanceOf(RequestFailed);
		expect(err).toMatchObject({ status: 422, code: 'invalid', message: 'The request body is not valid. Enter a unit name.' });
		expect(err.issues).toEqual([{ path: ['name'], message: 'Enter a unit name.' }]);
		expect(err.detail.code).toBe('invalid');
	});

	it('a refusal without the API error shape says the status; a network failure is status 0', async () => {
		answer(() => new Response('<html>', { status: 502, statusText: 'Bad Gateway' }));
		await expect(getJson('/a')).rejects.toMatchObject({ status: 502, message: '502 Bad Gateway' });
		answer(() => Promise.reject(new TypeError('fetch failed')));
		await expect(getJson('/a')).rejects.toMatchObject({ status: 0, message: expect.stringContaining('did not reach the server') });
	});

	it('sendForm(url, form) posts the form as it is (the browser sets the multipart boundary)', async () => {
		const calls = answer(() => json({ files: [] }, 201));
		const form = new FormData();
		form.append('file', new Blob(['a,b']), 'x.csv');
		expect(await sendForm('/up', form)).toEqual({ files: [] });
		expect(calls[0].init.body).toBe(form);
		expect((calls[0].init.headers as Record<string, string>)['content-type']).toBeUndefined();
	});
});
