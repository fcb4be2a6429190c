// Responses that download a file.

/**
 * A streamed CSV download of `chunks` under `filename` (letters, digits, dot, dash and underscore kept): a
 * streamResponse, so a project's every reading is written while other requests keep being answered.
 */
export function csvResponse(chunks: Iterator<string>, filename: string): Response {
	async function* each() {
		try {
			for (let next = chunks.next(); !next.done; next = chunks.next()) yield next.value;
		} finally {
			chunks.return?.();
		}
	}
	return streamResponse(each(), { filename: safeFileName(filename, 'download.csv'), contentType: 'text/csv; charset=utf-8', abort: new AbortController() });
}

/** A file name of letters, digits, dot, dash and underscore (others become dashes), never empty. */
export function safeFileName(name: string, fallback = 'download'): string {
	return name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/-{2,}/g, '-').replace(/^-+|-+$/g, '') || fallback;
}

/** How long a download may produce chunks without letting the server's other requests in. */
const TURN_MS = 15;

/**
 * A streamed download of `chunks` under `filename`: each chunk is produced when the client is ready for it (the
 * stream is pulled, so a slow reader holds the producer back), and a client that goes away cancels it: `abort`
 * is aborted and the generator is closed, which stops the work behind it. A reader as fast as the producer (on
 * loopback, say) never holds it back, and chunks made from memory follow one another in microtasks: every
 * TURN_MS the stream waits for the event loop's next turn, so other requests are answered meanwhile (measured: a
 * GET waited 1.5 s while a million-row CSV was written; see the export-mesh benchmark).
 */
export function streamResponse(
	chunks: AsyncGenerator<Uint8Array | string>,
	{ filename, contentType, abort, headers = {} }: { filename: string; contentType: string; abort: AbortController; headers?: Record<string, string> }
): Response {
	const encoder = new TextEncoder();
	let turn = performance.now();
	const body = new ReadableStream<Uint8Array>(
		{
			async pull(controller) {
				try {
					if (performance.now() - turn > TURN_MS) {
						await new Promise((resolve) => setImmediate(resolve));
						turn = performance.now();
					}
					const next = await chunks.next();
					if (next.done) controller.close();
					else controller.enqueue(typeof next.value === 'string' ? encoder.encode(next.value) : next.value);
				} catch (err) {
					if (abort.signal.aborted) return;
					console.error('[download]', err);
					controller.error(err);
				}
			},
			async cancel() {
				abort.abort();
				await chunks.return(undefined).catch(() => undefined);
			}
		},
		{ highWaterMark: 1 }
	);
	return new Response(body, {
		headers: { 'content-type': contentType, 'content-disposition': `attachment; filename="${safeFileName(filename)}"`, 'cache-control': 'no-store', ...headers }
	});
}
