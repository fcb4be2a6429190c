import { AsyncLocalStorage } from 'node:async_hooks';

/**
 * Per-request facts that Auth.js callbacks cannot see on their own (they receive a synthetic Request):
 * the client's address, for throttling, and its user agent, to name the device of a new session.
 */
export interface RequestContext {
	address: string;
	userAgent?: string | null;
}

export const requestContext = new AsyncLocalStorage<RequestContext>();

export function clientAddress(): string {
	return requestContext.getStore()?.address ?? 'unknown';
}

export function clientUserAgent(): string | null {
	return requestContext.getStore()?.userAgent ?? null;
}
