/** Small helpers of the download endpoints: query strings, realization numbers, node streams as chunks. */
import type { Readable } from 'node:stream';
import type { z } from 'zod';
import { ApiError } from '$lib/server/api';
import { ServiceError } from '$lib/server/errors';

/** The URL's query validated by `schema`. @throws ApiError 422 with the issues */
export function queryOf<S extends z.ZodType>(url: URL, schema: S): z.output<S> {
	const raw: Record<string, string> = {};
	for (const [k, v] of url.searchParams) raw[k] = v;
	const parsed = schema.safeParse(raw);
	if (!parsed.success) throw new ApiError(422, 'The query is not valid.', parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	return parsed.data;
}

/** A realization number from a path segment. @throws ServiceError 404 for anything but digits */
export function realizationNumber(text: string | undefined): number {
	if (!/^\d{1,9}$/.test(text ?? '')) throw new ServiceError(404, `Realization ${text ?? ''} does not exist.`);
	return Number(text);
}

/** A node stream's chunks, read one at a time (closing early destroys the stream). */
export async function* nodeChunks(stream: Readable): AsyncGenerator<Uint8Array> {
	try {
		for await (const chunk of stream) yield chunk as Uint8Array;
	} finally {
		if (!stream.destroyed) stream.destroy();
	}
}
