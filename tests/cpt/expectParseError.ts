// Shared by the parser tests: run `fn` and check it throws a CptParseError with this code and location.
import { expect } from 'vitest';
import { CptParseError } from '$lib/cpt';
import type { CptParseErrorCode } from '$lib/cpt';

export function expectParseError(fn: () => unknown, code: CptParseErrorCode, line?: number, column?: string): CptParseError {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(CptParseError);
		const err = e as CptParseError;
		expect(err.code).toBe(code);
		expect(err.line).toBe(line);
		expect(err.column).toBe(column);
		return err;
	}
	return expect.fail('expected a CptParseError');
}
