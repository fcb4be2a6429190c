import { AsyncLocalStorage } from 'node:async_hooks';

/**
 * Per-request facts that Auth.js callbacks cannot see on their own (they receive a synthetic Request):
 * the client's address, for throttling.
 */
export interface RequestContext {
	address: string;
}

export const requestContext = new AsyncLocalStorage<RequestContext>();

export function clientAddress(): string {
	return requestContext.getStore()?.address ?? 'unknown';
}
