import { json } from '@sveltejs/kit';
import { ApiError } from './api';
import type { ImportRejected } from './services/import';

/** Largest multipart request the upload endpoints read: several files of up to 50 MB each. */
export const MAX_UPLOAD_REQUEST_BYTES = 200 * 1024 * 1024;

/**
 * Reads a multipart/form-data body, refusing it with 413 as soon as it passes `maxBytes` (by its declared
 * length, or while streaming when none is declared), so an oversized upload is never held in memory whole.
 * @throws ApiError 400 for another content type or a malformed body, 413 when too large.
 */
export async function readMultipart(request: Request, maxBytes = MAX_UPLOAD_REQUEST_BYTES): Promise<FormData> {
	const type = request.headers.get('content-type') ?? '';
	if (!/^multipart\/form-data/i.test(type)) throw new ApiError(400, 'Send the files as multipart/form-data.');
	const tooLarge = () => new ApiError(413, `The upload is larger than ${maxBytes / (1024 * 1024)} MB; send fewer files at a time.`);
	if (Number(request.headers.get('content-length') ?? 0) > maxBytes) throw tooLarge();
	const chunks: Uint8Array[] = [];
	let total = 0;
	if (request.body) {
		const reader = request.body.getReader();
		for (;;) {
			const { done, value } = await reader.read();
			if (done) break;
			total += value.byteLength;
			if (total > maxBytes) {
				await reader.cancel();
				throw tooLarge();
			}
			chunks.push(value);
		}
	}
	try {
		return await new Response(new Blob(chunks as BlobPart[]), { headers: { 'content-type': type } }).formData();
	} catch {
		throw new ApiError(400, 'The upload is not valid multipart/form-data.');
	}
}

/** The files sent under `field`, with their bytes. */
export async function filesOf(form: FormData, field: string): Promise<{ name: string; bytes: Uint8Array }[]> {
	const files = form.getAll(field).filter((v): v is File => typeof v !== 'string');
	return Promise.all(files.map(async (f) => ({ name: f.name || 'upload', bytes: new Uint8Array(await f.arrayBuffer()) })));
}

/** A JSON text field of the form (absent → undefined). @throws ApiError 400 when it is not JSON. */
export function jsonField(form: FormData, field: string): unknown {
	const value = form.get(field);
	if (value === null) return undefined;
	if (typeof value !== 'string') throw new ApiError(400, `The ${field} field must be JSON text, not a file.`);
	try {
		return JSON.parse(value);
	} catch {
		throw new ApiError(400, `The ${field} field is not valid JSON.`);
	}
}

/** A refused upload in the API's error shape, with each refused file's problem (file, line, column) beside the issues, and the plan when there is one. */
export function rejectedUploadResponse(err: ImportRejected): Response {
	const issues = err.problems.map((p) => ({
		path: [p.file, ...(p.line !== undefined ? [p.line] : []), ...(p.column !== undefined ? [p.column] : [])],
		message: p.message
	}));
	return json({ error: { code: err.code, message: err.message, issues, files: err.problems, ...(err.plan ? { plan: err.plan } : {}) } }, { status: err.status });
}
