import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { ApiError, endpoint, parseJson, parseQuery, parseValue } from '../../src/lib/server/api';
import type { RequestEvent } from '@sveltejs/kit';

const schema = z.strictObject({ n: z.coerce.number().int().min(1), name: z.string().optional() });

function refusal(fn: () => unknown): ApiError {
	try {
		fn();
	} catch (err) {
		if (err instanceof ApiError) return err;
		throw err;
	}
	throw new Error('expected an ApiError');
}

describe('parseValue(value, schema, message)', () => {
	it('parseValue returns the parsed value when it matches', () => {
		expect(parseValue({ n: '3' }, schema, 'bad')).toEqual({ n: 3 });
	});

	it('parseValue refuses a mismatch with 422, the message and each issue with its path', () => {
		const err = refusal(() => parseValue({ n: 0, extra: 1 }, schema, 'The options are not valid.'));
		expect(err.status).toBe(422);
		expect(err.message).toBe('The options are not valid.');
		expect(err.issues!.map((i) => i.path.join('.')).sort()).toEqual(['', 'n']);
	});
});

describe('parseQuery(url, schema, what)', () => {
	it('parseQuery reads the query parameters as strings', () => {
		expect(parseQuery(new URL('http://x/y?n=12&name=a'), schema)).toEqual({ n: 12, name: 'a' });
	});

	it('parseQuery names what it read in the 422', () => {
		const err = refusal(() => parseQuery(new URL('http://x/y?n=-1'), schema, 'summary query'));
		expect(err.status).toBe(422);
		expect(err.message).toBe('The summary query is not valid.');
	});
});

describe('parseJson(request, schema)', () => {
	const post = (body: string, headers: Record<string, string> = {}) => new Request('http://x/y', { method: 'POST', body, headers });

	it('parseJson refuses text that is not JSON with 400, a body over the limit with 413, a mismatch with 422', async () => {
		await expect(parseJson(post('{'), schema)).rejects.toMatchObject({ status: 400 });
		await expect(parseJson(post(JSON.stringify({ n: 1, name: 'x'.repeat(100) })), schema, { maxBytes: 50 })).rejects.toMatchObject({ status: 413 });
		await expect(parseJson(post('{"n":0}'), schema)).rejects.toMatchObject({ status: 422 });
		expect(await parseJson(post('{"n":2}'), schema)).toEqual({ n: 2 });
	});
});

describe('endpoint(handler)', () => {
	const call = (handler: (e: RequestEvent) => Promise<Response>, body: string | null) =>
		(endpoint(handler) as unknown as (e: RequestEvent) => Promise<Response>)({ request: new Request('http://x/upload', { method: 'POST', body }) } as RequestEvent);

	it('a refusal before the body was read says Connection: close (the client is still sending it); after reading, it does not', async () => {
		const early = await call(async () => {
			throw new ApiError(403, 'No.');
		}, 'x'.repeat(100_000));
		expect(early.status).toBe(403);
		expect(early.headers.get('connection')).toBe('close');
		expect(await early.json()).toMatchObject({ error: { message: 'No.' } });
		const late = await call(async (e) => {
			await e.request.text();
			throw new ApiError(422, 'Read, then refused.');
		}, 'abc');
		expect(late.status).toBe(422);
		expect(late.headers.get('connection')).toBeNull();
		const bodiless = await call(async () => {
			throw new ApiError(404, 'Not here.');
		}, null);
		expect(bodiless.headers.get('connection')).toBeNull();
	});
});
