import { describe, expect, it } from 'vitest';
import { CancelledError } from '../src/lib/cancelled-error';

describe('CancelledError', () => {
	it('new CancelledError() is an Error named CancelledError with the message "cancelled"', () => {
		const e = new CancelledError();
		expect(e).toBeInstanceOf(Error);
		expect(e).toBeInstanceOf(CancelledError);
		expect([e.name, e.message]).toEqual(['CancelledError', 'cancelled']);
	});

	it('CancelledError.revive(err) restores the class of an error that crossed comlink (name kept, class lost)', () => {
		// comlink rebuilds a thrown error as Object.assign(new Error(message), { name, message, stack }).
		const crossed = Object.assign(new Error('cancelled'), { name: 'CancelledError' });
		const revived = CancelledError.revive(crossed);
		expect(revived).toBeInstanceOf(CancelledError);
		expect((revived as Error).message).toBe('cancelled');
	});

	it('CancelledError.revive(x) returns a CancelledError itself, other errors and non-errors unchanged', () => {
		const own = new CancelledError();
		const other = new RangeError('bad lag');
		expect(CancelledError.revive(own)).toBe(own);
		expect(CancelledError.revive(other)).toBe(other);
		expect(CancelledError.revive('CancelledError')).toBe('CancelledError');
		expect(CancelledError.revive({ name: 'CancelledError' })).toEqual({ name: 'CancelledError' });
	});
});
