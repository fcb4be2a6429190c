import { isHttpError, isRedirect, json, type RequestEvent, type RequestHandler } from '@sveltejs/kit';
import { z } from 'zod';
import { ERROR_CODES, InvalidInput, ServiceError, type ErrorStatus } from './errors';

/** Largest JSON body an endpoint reads unless it says otherwise. */
export const MAX_JSON_BYTES = 1024 * 1024;

export interface ApiIssue {
	path: (string | number)[];
	message: string;
}

/** `{ "error": { "code", "message", "issues"? } }` with the given status. */
export function apiError(status: ErrorStatus, message: string, issues?: ApiIssue[], code: string = ERROR_CODES[status]): Response {
	// A 413 leaves the body unread; closing the connection keeps a client from reusing a socket mid-body.
	const headers = status === 413 ? { connection: 'close' } : undefined;
	return json({ error: { code, message, ...(issues ? { issues } : {}) } }, { status, headers });
}

/** Thrown inside an endpoint to answer with an API error. */
export class ApiError extends ServiceError {
	constructor(
		status: ErrorStatus,
		message: string,
		readonly issues?: ApiIssue[]
	) {
		super(status, message);
	}
}

function issuesOf(err: z.ZodError): ApiIssue[] {
	return err.issues.map((i) => ({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), message: i.message }));
}

/**
 * Reads a JSON body and validates it: 413 when larger than `maxBytes`, 400 when it is not JSON,
 * 422 with the issues when it does not match the schema.
 */
export async function parseJson<S extends z.ZodType>(
	request: Request,
	schema: S,
	{ maxBytes = MAX_JSON_BYTES } = {}
): Promise<z.output<S>> {
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > maxBytes) throw new ApiError(413, `The request body is larger than ${maxBytes} bytes.`);
	const text = await request.text();
	if (Buffer.byteLength(text) > maxBytes) throw new ApiError(413, `The request body is larger than ${maxBytes} bytes.`);
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		throw new ApiError(400, 'The request body is not valid JSON.');
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) throw new ApiError(422, 'The request body is not valid.', issuesOf(parsed.error));
	return parsed.data;
}

/** Validates a value already read (upload options, a query): 422 with `message` and the issues when it does not match. */
export function parseValue<S extends z.ZodType>(value: unknown, schema: S, message: string): z.output<S> {
	const parsed = schema.safeParse(value);
	if (!parsed.success) throw new ApiError(422, message, issuesOf(parsed.error));
	return parsed.data;
}

/** Validates a request's query parameters (`?a=1&b=2` as an object of strings): 422 with the issues when they do not match. */
export function parseQuery<S extends z.ZodType>(url: URL, schema: S, what = 'query'): z.output<S> {
	return parseValue(Object.fromEntries(url.searchParams), schema, `The ${what} is not valid.`);
}

/**
 * Wraps a JSON endpoint so every refusal has the API's error shape: HttpErrors thrown by the
 * authorization helper, ServiceErrors from services, ApiErrors from parsing. Anything else is logged and answers 500.
 */
export function endpoint<E extends RequestEvent = RequestEvent<Record<string, string>>>(handler: (event: E) => Promise<Response> | Response) {
	return (async (event: E) => {
		try {
			return await handler(event);
		} catch (err) {
			if (isRedirect(err)) throw err;
			return closingUnread(event.request, refusal(err));
		}
	}) as unknown as RequestHandler;
}

/**
 * A refusal sent before the request's body was read (a wrong role refuses an upload at once) says
 * `Connection: close`: the client is still sending the body, and a client that reused that connection for its next
 * request could have it reset under it (seen: ECONNRESET on the next upload after a refused one, about one run in four).
 */
function closingUnread(request: Request, res: Response): Response {
	if (request.body !== null && !request.bodyUsed) res.headers.set('connection', 'close');
	return res;
}

/** The JSON answer to an error thrown by an endpoint's handler. */
function refusal(err: unknown): Response {
	if (err instanceof ApiError) return apiError(err.status, err.message, err.issues);
	if (err instanceof InvalidInput) return apiError(422, err.message, err.issues);
	if (err instanceof ServiceError) return apiError(err.status, err.message, undefined, err.code);
	if (isHttpError(err)) {
		const status = (err.status in ERROR_CODES ? err.status : 500) as ErrorStatus;
		return apiError(status, err.body.message);
	}
	if (err instanceof z.ZodError) return apiError(422, 'The request is not valid.', issuesOf(err));
	console.error('[api]', err);
	return apiError(500, 'Something went wrong on the server.');
}
