import { fail, type ActionFailure } from '@sveltejs/kit';
import { z } from 'zod';
import { ServiceError } from './errors';

/** Errors as the shared FormErrors component reads them. */
export interface FormErrorsData {
	formErrors: string[];
	fieldErrors: Record<string, string[] | undefined>;
}

export type FormFailure = ActionFailure<{ errors: FormErrorsData; values: Record<string, string> }>;

function valuesOf(data: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [k, v] of data) if (typeof v === 'string' && !/password|confirm|current/i.test(k)) values[k] = v;
	return values;
}

/** A failure with one message for the whole form. */
export function formFailure(status: number, message: string, values: Record<string, string> = {}): FormFailure {
	return fail(status, { errors: { formErrors: [message], fieldErrors: {} }, values });
}

/**
 * Reads a form and validates it with a zod schema. On failure, returns `fail(400, { errors, values })`
 * (passwords are never echoed back) for the action to return as is.
 */
export async function parseForm<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<{ ok: true; data: z.output<S>; form: FormData } | { ok: false; failure: FormFailure }> {
	const form = await request.formData();
	const parsed = schema.safeParse(Object.fromEntries([...form].filter(([, v]) => typeof v === 'string')));
	if (parsed.success) return { ok: true, data: parsed.data, form };
	const flat = z.flattenError(parsed.error);
	return {
		ok: false,
		failure: fail(400, {
			errors: { formErrors: flat.formErrors, fieldErrors: flat.fieldErrors as Record<string, string[] | undefined> },
			values: valuesOf(form)
		})
	};
}

/** Runs a service call in an action, turning a ServiceError into a form message. */
export async function attempt<T>(run: () => T | Promise<T>): Promise<{ ok: true; value: T } | { ok: false; failure: FormFailure }> {
	try {
		return { ok: true, value: await run() };
	} catch (err) {
		if (err instanceof ServiceError) return { ok: false, failure: formFailure(err.status, err.message) };
		throw err;
	}
}
