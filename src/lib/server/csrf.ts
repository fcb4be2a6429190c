import { text } from '@sveltejs/kit';
import { apiError } from './api';

/** Content types an HTML form can send cross-site without a CORS preflight (as SvelteKit's own check lists them). */
const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * The cross-site request forgery check, in place of SvelteKit's (switched off in svelte.config.js so this one
 * can tell credentials apart). A state-changing request with a form content type must come from this origin —
 * unless it is an /api request carrying an `Authorization` header: such a request is authenticated by that
 * header alone (the session cookie is not consulted), and a cross-site page cannot set it without a CORS
 * preflight, which this server never grants. So scripts can upload with a token and no Origin header, while
 * cookie sessions keep the check. Returns the refusal, or null to let the request through.
 */
export function crossSiteRefusal(request: Request, url: URL): Response | null {
	if (!UNSAFE_METHODS.has(request.method)) return null;
	const type = (request.headers.get('content-type') ?? '').split(';', 1)[0].trim().toLowerCase();
	if (!FORM_TYPES.includes(type)) return null;
	if (request.headers.get('origin') === url.origin) return null;
	const isApi = url.pathname.startsWith('/api/');
	if (isApi && request.headers.has('authorization')) return null;
	const message = `Cross-site ${request.method} form submissions are forbidden: the Origin header must be ${url.origin}.`;
	const refusal = isApi || request.headers.get('accept')?.includes('application/json') ? apiError(403, message) : text(message, { status: 403 });
	return refusal;
}

const DRAIN_LIMIT = 1024 * 1024;

/**
 * Sends a refusal decided before the request body was read. A small body (declared ≤ 1 MiB) is read and
 * dropped first, so the client finishes writing and may keep the connection; a larger or undeclared one is
 * not read, and the connection closes rather than be reused mid-body.
 */
export async function refuseUnread(request: Request, response: Response): Promise<Response> {
	if (!request.body || request.bodyUsed) return response;
	const declared = Number(request.headers.get('content-length'));
	if (request.headers.has('content-length') && Number.isFinite(declared) && declared <= DRAIN_LIMIT) {
		await request.arrayBuffer().catch(() => undefined);
		return response;
	}
	response.headers.set('connection', 'close');
	return response;
}
