/** HTTP statuses the JSON API answers with, and their machine-readable codes. */
export const ERROR_CODES = {
	400: 'bad_request',
	401: 'unauthorized',
	403: 'forbidden',
	404: 'not_found',
	409: 'conflict',
	413: 'payload_too_large',
	422: 'invalid',
	500: 'internal',
	503: 'unavailable'
} as const;

export type ErrorStatus = keyof typeof ERROR_CODES;

/**
 * A refusal a service can explain to the user (a conflict, a missing record). Routes turn it into a
 * JSON error or a form message; anything else that is thrown is a bug and answers 500.
 */
export class ServiceError extends Error {
	constructor(
		readonly status: ErrorStatus,
		message: string,
		readonly code: string = ERROR_CODES[status]
	) {
		super(message);
		this.name = 'ServiceError';
	}
}

/** One problem with an input, where it is and what is wrong (the API's `issues`). */
export interface InputIssue {
	path: (string | number)[];
	message: string;
}

/** An input that is well formed but cannot be used (a domain without a saved variogram …): 422 with its issues. */
export class InvalidInput extends ServiceError {
	constructor(
		message: string,
		readonly issues: InputIssue[]
	) {
		super(422, message);
		this.name = 'InvalidInput';
	}
}
