/**
 * The browser's fetch helpers for /api/v1: JSON in and out, the API's error shape
 * `{ error: { code, message, issues? } }` turned into a RequestFailed with a readable message.
 */

/** One problem with a request body, as the API reports it. */
export interface ApiIssue {
	path: (string | number)[];
	message: string;
}

/** A request the API refused (or that never reached it: status 0). */
export class RequestFailed extends Error {
	constructor(
		message: string,
		readonly status: number,
		readonly code: string = '',
		readonly issues: ApiIssue[] = [],
		/** The whole error object, for endpoints that say more (e.g. the problems of each uploaded file). */
		readonly detail: Record<string, unknown> = {}
	) {
		super(message);
		this.name = 'RequestFailed';
	}
}

async function failure(res: Response): Promise<RequestFailed> {
	const body = await res.json().catch(() => ({}));
	const error = (body?.error ?? {}) as { code?: string; message?: string; issues?: ApiIssue[] };
	const issues = Array.isArray(error.issues) ? error.issues : [];
	const message = [error.message ?? `${res.status} ${res.statusText}`.trim(), ...issues.map((i) => i.message)].join(' ');
	return new RequestFailed(message, res.status, error.code, issues, error as Record<string, unknown>);
}

async function request<T>(url: string, init: RequestInit): Promise<T> {
	let res: Response;
	try {
		res = await fetch(url, { ...init, headers: { accept: 'application/json', ...init.headers } });
	} catch {
		throw new RequestFailed('The request did not reach the server; check the connection and try again.', 0);
	}
	if (!res.ok) throw await failure(res);
	return (res.status === 204 ? undefined : await res.json()) as T;
}

/** GET a JSON body. @throws {RequestFailed} */
export function getJson<T>(url: string): Promise<T> {
	return request<T>(url, { method: 'GET' });
}

/** Sends a JSON body (or none) and reads the JSON answer; undefined for 204. @throws {RequestFailed} */
export function send<T = unknown>(method: 'POST' | 'PUT' | 'PATCH' | 'DELETE', url: string, body?: unknown): Promise<T> {
	return request<T>(url, body === undefined ? { method } : { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
}

/** POSTs a multipart form (file uploads) and reads the JSON answer. @throws {RequestFailed} */
export function sendForm<T = unknown>(url: string, body: FormData): Promise<T> {
	return request<T>(url, { method: 'POST', body });
}
