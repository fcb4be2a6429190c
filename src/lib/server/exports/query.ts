/** Small helpers of the download endpoints: realization numbers, node streams as chunks. */
import type { Readable } from 'node:stream';
import { ServiceError } from '$lib/server/errors';

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
