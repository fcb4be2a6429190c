import type { RequestHandler } from './$types';
import { apiError } from '$lib/server/api';

/** Unknown API paths answer in the API's error shape rather than with an HTML page. */
const notFound: RequestHandler = () => apiError(404, 'No such API endpoint.');

export const GET = notFound;
export const POST = notFound;
export const PATCH = notFound;
export const PUT = notFound;
export const DELETE = notFound;
