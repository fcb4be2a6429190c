// Responses that download a file.

/** A streamed CSV download of `chunks` under `filename` (letters, digits, dot, dash and underscore kept). */
export function csvResponse(chunks: Iterator<string>, filename: string): Response {
	const encoder = new TextEncoder();
	const safe = filename.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/-{2,}/g, '-').replace(/^-+|-+$/g, '') || 'download.csv';
	const body = new ReadableStream<Uint8Array>({
		pull(controller) {
			const next = chunks.next();
			if (next.done) controller.close();
			else controller.enqueue(encoder.encode(next.value));
		}
	});
	return new Response(body, {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${safe}"`, 'cache-control': 'no-store' }
	});
}
